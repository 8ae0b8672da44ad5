import { describe, expect, it } from 'vitest';
import { cutPlan } from '../../../src/lib/treatment/cut-plan';
import type { StockSheet } from '../../../src/lib/treatment/cutlist';
import type { Part } from '../../../src/lib/treatment/parts';
import { cutStepText, FINISH_WORDS, sequenceLines } from '../../../src/lib/plans/cut-steps';

// 8 × 4 ft sheet (96 × 48 in, 1 in = 25.4 mm exactly), 1/8 in kerf, a saw that takes 50 × 50 in.
const IN = 25.4;
const SHEET: StockSheet = { id: 'ply', lengthMm: 96 * IN, widthMm: 48 * IN, thicknessMm: 11.9, finishedFaces: 2, grain: 'along-length' };
const part = (name: string, quantity: number, lengthIn: number, widthIn: number, faces: 0 | 1 | 2): Part => ({ name, quantity, lengthMm: lengthIn * IN, widthMm: widthIn * IN, thicknessMm: 11.9, finishedFaces: faces, grain: 'along-length' });

describe('the cut sequence in words', () => {
	const plan = cutPlan([part('fin', 6, 46, 8, 2), part('strip', 4, 46, 2.5, 1)], [SHEET], { kerfMm: IN / 8, sawLimit: { lengthMm: 50 * IN, widthMm: 50 * IN } });
	const sheet = plan.sheets[0];
	const keyOf = (p: { name: string }) => (p.name === 'fin' ? '1' : '2');

	it('halves the sheet first: (96 − 1/8) / 2 = 47 15/16 in', () => {
		expect(cutStepText(sheet.steps[0], sheet, keyOf, 'in')).toBe('Crosscut the sheet 47 15/16″ from its end (into 2 pieces of 47 15/16″ × 48″).');
	});

	it('says a run of equal strips once, every strip still counted', () => {
		const lines = sequenceLines(sheet, keyOf, 'in');
		expect(lines[0]).toMatch(/^Crosscut the sheet/);
		const counted = lines.slice(1).reduce((n, l) => n + Number(/^Rip (\d+) strips/.exec(l)?.[1] ?? (/^Rip a strip/.test(l) ? 1 : 0)), 0);
		expect(counted).toBe(sheet.steps.filter((s) => s.kind === 'rip').length);
		expect(lines.some((l) => /^Rip \d+ strips 8″ wide from piece \d; crosscut each into 1 × \[1\]\.$/.test(l))).toBe(true);
		expect(FINISH_WORDS[sheet.finishFaces]).toMatch(/both faces/);
	});
});
