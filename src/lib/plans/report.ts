// The plan as the client's report tells it: what was planned and where, in plain words, and the
// predicted reverberation time per band beside the target and, once measured, the result.
import type { LengthUnit } from '../treatment/units';
import type { PlanEvaluation } from './evaluate';
import { formatHz } from '../format';
import { moneyText, sizeText } from './format';
import { ITEM_KIND_LABELS, SURFACE_LABELS, type PlanItem } from './types';
import type { PlanCost } from './build';
import { unitWidthMm } from './items';

export interface PlanReportBand {
	bandHz: number;
	measuredBeforeS: number | null;
	predictedS: number | null;
	target: { targetS: number; lowerS: number; upperS: number } | null;
	measuredAfterS: number | null;
	differenceS: number | null;
}

export interface PlanReport {
	title: string;
	/** One sentence per item. */
	lines: string[];
	bands: PlanReportBand[];
	/** How the prediction was made, in one paragraph. */
	method: string;
	cost: string | null;
	measuredAfter: boolean;
}

function itemLine(item: PlanItem, evaluation: PlanEvaluation, unit: LengthUnit): string {
	const result = evaluation.items.find((r) => r.id === item.id);
	const where = item.surface ? `on the ${SURFACE_LABELS[item.surface].toLowerCase()}` : 'free-standing';
	const kind = ITEM_KIND_LABELS[item.params.kind].toLowerCase();
	const acts = result?.actionRangeHz ? `, working from ${formatHz(result.actionRangeHz.loHz)} to ${formatHz(result.actionRangeHz.hiHz)}` : '';
	const verb = item.params.kind === 'diffuser' ? 'scatters sound' : 'absorbs sound';
	return `${item.quantity} × ${item.label} (${kind}, ${sizeText(unitWidthMm(item), item.heightMm, unit)}) ${where}: ${verb}${acts}.`;
}

function predictionMethod(evaluation: PlanEvaluation, measuredAfter: boolean): string {
	if (evaluation.problems.length > 0) return `No prediction yet: ${evaluation.problems[0]}.`;
	const formula = evaluation.bands[0].formula;
	const start =
		evaluation.calibration === 'assumed finishes only'
			? 'The prediction starts from the room as its surfaces and finishes make it (it has not been measured before treatment)'
			: `The prediction starts from the room as measured before treatment${evaluation.calibration === 'partly measured' ? ' (in the bands that could be measured; the others from its finishes)' : ''}`;
	return (
		`${start} and adds the absorption of each planned item, worked out from its construction (porous layers by an empirical fibre model, ` +
		`panel traps by their mass–spring resonance, diffusers as a small planning value); reverberation times by ${formula[0].toUpperCase()}${formula.slice(1)}'s formula with air absorption per ISO 9613-1.` +
		(measuredAfter ? ' Measured after is the room measured again once the treatment was installed; the difference is predicted minus measured.' : '')
	);
}

export function planReport(items: readonly PlanItem[], evaluation: PlanEvaluation, cost: PlanCost, currency: string, unit: LengthUnit): PlanReport {
	const measuredAfter = evaluation.bands.some((b) => b.measuredAfterS !== null);
	return {
		title: 'Treatment plan',
		lines: items.map((item) => itemLine(item, evaluation, unit)),
		bands: evaluation.bands.map((b) => ({
			bandHz: b.bandHz,
			measuredBeforeS: b.measuredBeforeS,
			predictedS: b.predictedS,
			target: b.target ? { targetS: b.target.targetS, lowerS: b.target.lowerS, upperS: b.target.upperS } : null,
			measuredAfterS: b.measuredAfterS,
			differenceS: b.differenceS
		})),
		method: predictionMethod(evaluation, measuredAfter),
		cost: cost.priced ? `Materials estimate: ${moneyText(cost.total, currency)}${cost.unpriced.length ? ' (some items unpriced)' : ''}.` : null,
		measuredAfter
	};
}
