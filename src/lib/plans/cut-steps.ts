// The order of work at the saw in words, sheet by sheet: which faces to finish before cutting,
// the breakdown cuts, then each strip ripped and crosscut into its parts (keys of the legend).
import type { CutStep, PlannedSheet } from '../treatment/cut-plan';
import type { Placement } from '../treatment/cutlist';
import type { FinishedFaces } from '../treatment/parts';
import type { LengthUnit } from '../treatment/units';
import { lengthText, sizeText } from './format';

export const FINISH_WORDS: Record<FinishedFaces, string> = {
	2: 'Finish both faces before cutting: its parts show both sides.',
	1: 'Finish the good face before cutting: its parts show one side.',
	0: 'No finish: its parts are hidden.'
};

/** "3 × 4, 1 × 7": each key with its count, in the order the pieces come off the strip. */
function piecesText(placements: readonly Placement[], keyOf: (p: Placement) => string): string {
	const counts: { key: string; n: number }[] = [];
	for (const p of placements) {
		const key = keyOf(p);
		const last = counts[counts.length - 1];
		if (last && last.key === key) last.n++;
		else counts.push({ key, n: 1 });
	}
	return counts.map((c) => `${c.n} × [${c.key}]`).join(', ');
}

export function cutStepText(step: CutStep, sheet: PlannedSheet, keyOf: (p: Placement) => string, unit: LengthUnit): string {
	const panels = sheet.layout.panels?.length ?? 0;
	switch (step.kind) {
		case 'breakdown':
			return step.direction === 'crosscut'
				? `Crosscut the sheet ${lengthText(step.atMm, unit)} from its end (into ${step.pieces} pieces of ${sizeText(step.resultLengthMm, step.resultWidthMm, unit)}).`
				: `Rip each piece ${lengthText(step.atMm, unit)} from its edge (${step.pieces} pieces of ${sizeText(step.resultLengthMm, step.resultWidthMm, unit)}).`;
		case 'rip':
			return `Rip a strip ${lengthText(step.stripWidthMm, unit)} wide${panels > 1 ? ` from piece ${step.panel}` : ''}.`;
		case 'crosscut':
			return `Crosscut it into ${piecesText(step.placements, keyOf)}.`;
	}
}

/**
 * The numbered lines of a sheet's cut sequence: breakdown cuts, then each strip ripped and
 * crosscut — strips in a row of the same width cut into the same pieces said once ("Rip 6
 * strips … ; crosscut each into …").
 */
export function sequenceLines(sheet: PlannedSheet, keyOf: (p: Placement) => string, unit: LengthUnit): string[] {
	const lines: string[] = [];
	const steps = sheet.steps;
	const panels = sheet.layout.panels?.length ?? 0;
	for (let i = 0; i < steps.length; i++) {
		const step = steps[i];
		const cut = steps[i + 1];
		if (step.kind !== 'rip' || cut?.kind !== 'crosscut') {
			lines.push(cutStepText(step, sheet, keyOf, unit));
			continue;
		}
		const pieces = piecesText(cut.placements, keyOf);
		let run = 1;
		while (true) {
			const r = steps[i + 2 * run];
			const c = steps[i + 2 * run + 1];
			if (r?.kind === 'rip' && c?.kind === 'crosscut' && r.panel === step.panel && Math.abs(r.stripWidthMm - step.stripWidthMm) < 1e-6 && piecesText(c.placements, keyOf) === pieces) run++;
			else break;
		}
		const from = panels > 1 ? ` from piece ${step.panel}` : '';
		lines.push(
			run === 1
				? `Rip a strip ${lengthText(step.stripWidthMm, unit)} wide${from}; crosscut it into ${pieces}.`
				: `Rip ${run} strips ${lengthText(step.stripWidthMm, unit)} wide${from}; crosscut each into ${pieces}.`
		);
		i += 2 * run - 1;
	}
	return lines;
}
