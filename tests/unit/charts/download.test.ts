import { describe, expect, it } from 'vitest';
import { csvFileName, downloadText } from '../../../src/lib/charts/download';
import { plotHeight } from '../../../src/lib/charts/plot-size';

describe('csvFileName', () => {
	const cases = [
		['Decay — 125 Hz', 'decay-125-hz.csv'],
		['Réponse en fréquence', 'reponse-en-frequence.csv'],
		['  T30 per band (after)  ', 't30-per-band-after.csv'],
		['—', 'chart.csv'],
		['', 'chart.csv']
	] as const;
	it.each(cases)('"%s" → %s', (title, expected) => {
		expect(csvFileName(title)).toBe(expected);
	});
});

describe('downloadText', () => {
	it('says it needs a browser when there is no document', () => {
		expect(() => downloadText('a.csv', 'x')).toThrow(/browser/);
	});
});

describe('plotHeight', () => {
	const cases = [
		{ width: 1000, expected: 380, why: 'wide: capped' },
		{ width: 600, expected: 300, why: 'half the width' },
		{ width: 360, expected: 220, why: 'phone width: the minimum keeps the plot readable' },
		{ width: 0, expected: 220, why: 'not laid out yet' },
		{ width: Number.NaN, expected: 220, why: 'unknown width' }
	];
	it.each(cases)('$why', ({ width, expected }) => {
		expect(plotHeight(width)).toBe(expected);
	});
	it('rejects a bad shape', () => {
		expect(() => plotHeight(500, 0)).toThrow(RangeError);
		expect(() => plotHeight(500, 0.5, 300, 200)).toThrow(RangeError);
	});
});
