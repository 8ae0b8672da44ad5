import { describe, expect, it } from 'vitest';
import {
	applyMicCorrection,
	correctionAt,
	correctionOnGrid,
	correctionRangeHz,
	isMicCorrectionError,
	parseMicCorrection
} from '../../../src/lib/analysis/mic-correction';

// The interpolation is a line in dB over log frequency; round-off only.
const ROUND_OFF = 1e-12;

function errorOf(text: string): { line: number | null; message: string } {
	try {
		parseMicCorrection(text);
	} catch (error) {
		if (isMicCorrectionError(error)) return { line: error.line, message: error.message };
		throw error;
	}
	throw new Error('expected the file to be refused');
}

describe('parseMicCorrection: the plain-text form (common practice, no source)', () => {
	const file = [
		'\uFEFF"Sens Factor =-1.2dB, SERNO: 7000001"',
		'* measured in a free field, 0°',
		'',
		'# frequency level phase',
		'; any of the four marks starts a comment',
		'20\t-2.5\t12.0',
		'31.5 -1.25',
		'100, -0.4',
		'1000,0',
		'  10000   1.5e0   -3 ',
		'20000\t+3'
	].join('\r\n');
	const parsed = parseMicCorrection(file);

	it('reads pairs separated by tabs, spaces or commas, ignoring a phase column', () => {
		expect(parsed.points).toEqual([
			{ freqHz: 20, db: -2.5 },
			{ freqHz: 31.5, db: -1.25 },
			{ freqHz: 100, db: -0.4 },
			{ freqHz: 1000, db: 0 },
			{ freqHz: 10000, db: 1.5 },
			{ freqHz: 20000, db: 3 }
		]);
	});

	it('keeps the comments (the serial number, say) without their marks', () => {
		expect(parsed.comments).toEqual([
			'Sens Factor =-1.2dB, SERNO: 7000001"',
			'measured in a free field, 0°',
			'frequency level phase',
			'any of the four marks starts a comment'
		]);
		expect(parsed.header).toBeNull();
	});

	it('keeps a first line of column names as the header', () => {
		const withHeader = parseMicCorrection('Freq(Hz) SPL(dB) Phase(deg)\n20 -1\n20000 1\n');
		expect(withHeader.header).toBe('Freq(Hz) SPL(dB) Phase(deg)');
		expect(withHeader.points).toHaveLength(2);
	});

	it.each([
		{ what: 'a frequency alone', text: '* c\n\n20 0\n100 0\n200 0\n# c\n1000\n2000 0', line: 7, pattern: /^line 7: expected a frequency and a level in dB/ },
		{ what: 'a word among the data', text: '20 0\n100 zero\n', line: 2, pattern: /^line 2: expected a frequency and a level in dB/ },
		{ what: 'a column too many', text: '20 0 1 2\n100 0\n', line: 1, pattern: /^line 1: expected a frequency and a level in dB/ },
		{ what: 'a header after the data', text: '20 0\nFreq SPL\n', line: 2, pattern: /^line 2: expected a frequency/ },
		{ what: 'a repeated frequency', text: '20 0\n100 0\n100 1\n', line: 3, pattern: /^line 3: frequency 100 Hz is not above the previous one \(100 Hz on line 2\)/ },
		{ what: 'a falling frequency', text: '20 0\n1000 0\n\n500 1\n', line: 4, pattern: /^line 4: frequency 500 Hz is not above the previous one \(1000 Hz on line 2\)/ },
		{ what: 'a frequency of 0 Hz', text: '0 0\n100 0\n', line: 1, pattern: /^line 1: frequency must be above 0 Hz/ },
		{ what: 'a negative frequency', text: '-20 0\n100 0\n', line: 1, pattern: /^line 1: frequency must be above 0 Hz/ },
		{ what: 'a decimal comma', text: '20\t-0,5\n100\t0\n', line: 1, pattern: /^line 1: decimal commas are not supported/ },
		{ what: 'an absolute level, not a deviation', text: '20 94\n100 94\n', line: 1, pattern: /^line 1: level 94 dB is outside ±50 dB/ }
	])('refuses $what, naming the line', ({ text, line, pattern }) => {
		const error = errorOf(text);
		expect(error.line).toBe(line);
		expect(error.message).toMatch(pattern);
	});

	it.each([
		{ what: 'an empty file', text: '', pattern: /needs at least two frequencies; the file has none/ },
		{ what: 'comments only', text: '# a\n* b\n', pattern: /has none/ },
		{ what: 'a single point', text: '1000 0\n', pattern: /has one/ }
	])('refuses $what as a whole', ({ text, pattern }) => {
		const error = errorOf(text);
		expect(error.line).toBeNull();
		expect(error.message).toMatch(pattern);
	});
});

describe('correctionAt: linear in dB over log frequency, flat beyond the ends', () => {
	const correction = { points: [{ freqHz: 100, db: 0 }, { freqHz: 1000, db: 3 }, { freqHz: 10000, db: -1 }] };

	it.each([
		{ freqHz: 100, db: 0 }, // the points themselves
		{ freqHz: 1000, db: 3 },
		{ freqHz: 10000, db: -1 },
		{ freqHz: Math.sqrt(100 * 1000), db: 1.5 }, // half-way in log frequency
		{ freqHz: 200, db: 3 * Math.log10(2) }, // lg(200/100)/lg(1000/100) of the way
		{ freqHz: 5000, db: 3 - 4 * Math.log10(5) },
		{ freqHz: 20, db: 0 }, // below the file: the first value
		{ freqHz: 0, db: 0 },
		{ freqHz: 20000, db: -1 } // above: the last value
	])('$freqHz Hz → $db dB', ({ freqHz, db }) => {
		expect(Math.abs(correctionAt(correction, freqHz) - db)).toBeLessThan(ROUND_OFF);
	});

	it('gives the same values on a grid, in any order', () => {
		const grid = [20, 200, 5000, 1000, 150, 20000];
		expect(correctionOnGrid(correction, grid)).toEqual(grid.map((f) => expect.closeTo(correctionAt(correction, f), 12)));
	});

	it('states the range it covers', () => {
		expect(correctionRangeHz(correction)).toEqual({ lowHz: 100, highHz: 10000 });
	});

	it('refuses points out of order or a NaN frequency', () => {
		expect(() => correctionAt({ points: [{ freqHz: 100, db: 0 }, { freqHz: 50, db: 0 }] }, 70)).toThrow(/increase/);
		expect(() => correctionAt(correction, Number.NaN)).toThrow(/NaN/);
	});
});

describe('applyMicCorrection: the microphone taken out of a response', () => {
	const correction = parseMicCorrection('100 -2\n1000 0\n10000 4\n');
	const response = { freqHz: [50, 100, 1000, 10000, 20000], db: [70, 72, 75, 78, 60] };

	it('subtracts the deviation (the usual sense of the file)', () => {
		const corrected = applyMicCorrection(response, correction);
		expect(corrected.freqHz).toEqual(response.freqHz);
		expect(corrected.db).toEqual([72, 74, 75, 74, 56].map((v) => expect.closeTo(v, 12)));
	});

	it('adds it when the file holds corrections', () => {
		expect(applyMicCorrection(response, correction, 'correction').db).toEqual([68, 70, 75, 82, 64].map((v) => expect.closeTo(v, 12)));
	});

	it('leaves the input alone and refuses mismatched arrays', () => {
		applyMicCorrection(response, correction);
		expect(response.db).toEqual([70, 72, 75, 78, 60]);
		expect(() => applyMicCorrection({ freqHz: [100], db: [] }, correction)).toThrow(/1 frequencies but 0 levels/);
	});
});
