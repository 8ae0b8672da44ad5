/**
 * Time of working a treatment plan through, as every plan page load does it.
 *
 *   npx tsx scripts/bench-plan.ts
 *
 * 1. the demo plan (5 items): evaluation, build sheets and cut list;
 * 2. a large studio plan: 40 porous panels in 8 items, 8 panel traps, 12 diffusers N = 13
 *    (several hundred pieces), to see how the cut list grows.
 * Prints the median of 20 runs (after 3 warm-up runs) per stage.
 */
import { evaluatePlan } from '../src/lib/plans/evaluate';
import { planBuilds, planCutList } from '../src/lib/plans/build';
import type { PlanItem, StoredPlan } from '../src/lib/plans/types';
import { MATERIALS } from '../src/lib/treatment/materials';
import { bs1116Target } from '../src/lib/analysis/targets';
import { PLANNING_BANDS_HZ } from '../src/lib/treatment/bands';
import { demoStoredPlan, UNTREATED_T60_S } from './demo/plan';

const catalogue = new Map(MATERIALS.map((m) => [m.id, m]));

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	return sorted[Math.floor(sorted.length / 2)];
}

function time(fn: () => void, runs = 20): number {
	for (let i = 0; i < 3; i++) fn();
	const ms: number[] = [];
	for (let i = 0; i < runs; i++) {
		const t0 = performance.now();
		fn();
		ms.push(performance.now() - t0);
	}
	return median(ms);
}

function bench(name: string, room: { lengthM: number; widthM: number; heightM: number }, plan: StoredPlan) {
	const input = {
		room,
		plan,
		catalogue,
		measuredBeforeS: UNTREATED_T60_S,
		measuredAfterS: null,
		target: bs1116Target(room.lengthM * room.widthM * room.heightM, PLANNING_BANDS_HZ)
	};
	const evaluation = evaluatePlan(input);
	if (evaluation.problems.length) throw new Error(`${name}: ${evaluation.problems.join('; ')}`);
	const { builds } = planBuilds(plan.items);
	const cut = planCutList(builds, plan.stock, plan.settings.kerfMm);
	if (!cut.ok) throw new Error(`${name}: ${cut.error}`);
	const evaluateMs = time(() => evaluatePlan(input));
	const buildMs = time(() => planBuilds(plan.items));
	const cutMs = time(() => planCutList(builds, plan.stock, plan.settings.kerfMm));
	console.log(
		`${name}: ${plan.items.length} items, ${cut.cutList.pieces.length} pieces on ${cut.cutList.sheetsUsed} sheets (yield ${cut.cutList.yieldPct.toFixed(1)} %)\n` +
			`  evaluate ${evaluateMs.toFixed(1)} ms · build sheets ${buildMs.toFixed(1)} ms · cut list ${cutMs.toFixed(1)} ms · total ${(evaluateMs + buildMs + cutMs).toFixed(1)} ms`
	);
}

bench('demo plan', { lengthM: 6.2, widthM: 4.35, heightM: 2.7 }, demoStoredPlan());

const demo = demoStoredPlan();
const porous = demo.items.find((i) => i.params.kind === 'porous')!;
const trap = demo.items.find((i) => i.params.kind === 'membrane')!;
const diffuser = demo.items.find((i) => i.params.kind === 'diffuser')!;
const surfaces = ['left', 'right', 'back', 'ceiling'] as const;
const items: PlanItem[] = [
	...Array.from({ length: 8 }, (_, i) => ({ ...porous, id: 100 + i, label: `Panel group ${i + 1}`, quantity: 5, surface: surfaces[i % 4] })),
	{ ...trap, id: 200, label: 'Corner traps', quantity: 8, surface: 'front' as const },
	{
		...diffuser,
		id: 300,
		label: 'Rear diffusers',
		quantity: 12,
		widthMm: 0,
		surface: null,
		params: { ...(diffuser.params as Extract<PlanItem['params'], { kind: 'diffuser' }>), prime: 13, wellWidthMm: 40 }
	}
];
bench('large studio plan', { lengthM: 12, widthM: 8, heightM: 4 }, { ...demo, items });
