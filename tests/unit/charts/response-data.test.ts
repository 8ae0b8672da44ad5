import { describe, expect, it } from 'vitest';
import { roomModes } from '../../../src/lib/analysis/room';
import {
	modesToMark,
	nominalThirdOctave,
	responseCsvRows,
	responsePlotData,
	responseTable,
	thirdOctaveCentres,
	type ResponseSeries
} from '../../../src/lib/charts/response-data';

// ISO 266:1997 nominal (preferred) one-third-octave frequencies, 20 Hz – 20 kHz.
const ISO_266_THIRDS = [
	20, 25, 31.5, 40, 50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 800, 1000, 1250, 1600, 2000, 2500, 3150, 4000, 5000, 6300,
	8000, 10000, 12500, 16000, 20000
];

/** Log-spaced grid, n points per octave, the way the analysis stores responses. */
function logGrid(fromHz: number, toHz: number, perOctave: number): number[] {
	const n = Math.floor(Math.log2(toHz / fromHz) * perOctave);
	return Array.from({ length: n + 1 }, (_, i) => fromHz * 2 ** (i / perOctave));
}

describe('one-third-octave centres', () => {
	it('are the IEC 61260-1 base-ten centres 1000·10^(x/10) with ISO 266 names', () => {
		const centres = thirdOctaveCentres(19, 21000);
		expect(centres).toHaveLength(31);
		// IEC 61260-1:2014 midband formula 1000·10^(x/10): third 63 → 63.096 Hz; 1e-3 Hz is the precision quoted.
		expect(centres[5]).toBeCloseTo(63.096, 3);
		centres.forEach((f, i) => expect(f).toBeCloseTo(1000 * 10 ** ((i - 17) / 10), 9));
		expect(centres.map(nominalThirdOctave)).toEqual(ISO_266_THIRDS);
	});
});

describe('responseTable', () => {
	// A response falling 3 dB per octave is a straight line on a log axis, so the value at any
	// third-octave centre is exactly −3·log2(f/1000) between the stored points.
	const grid = logGrid(20, 20000, 48);
	const falling: ResponseSeries = { label: 'Pos 1', tone: 'after', freqHz: grid, db: grid.map((f) => -3 * Math.log2(f / 1000)) };
	const narrow: ResponseSeries = { label: 'Pos 2, "mic"', tone: 'neutral', freqHz: [100, 1000], db: [0, 10] };

	it('reads each series at the third-octave centres', () => {
		const table = responseTable([falling, narrow]);
		expect(table.headers).toEqual(['Frequency (Hz)', 'Pos 1 (dB)', 'Pos 2, "mic" (dB)']);
		// The grid runs 20 Hz … 19.9 kHz: the 20 Hz band (19.95 Hz) and the 20 kHz band (19.95 kHz) fall outside it.
		const exact = Array.from({ length: 31 }, (_, i) => 1000 * 10 ** ((i - 17) / 10)).filter((f) => f >= grid[0] && f <= grid.at(-1)!);
		expect(exact).toHaveLength(29);
		expect(table.rows.map((r) => r[0])).toEqual(ISO_266_THIRDS.slice(1, 30));
		table.rows.forEach((row, i) => {
			// 0.05 dB: the table rounds to one decimal.
			expect(row[1] as number).toBeCloseTo(-3 * Math.log2(exact[i] / 1000), 1);
		});
		// Pos 2 spans 100 Hz … 1 kHz only: 10 dB per decade, so 1 dB per third; nothing outside.
		const at = (hz: number) => table.rows.find((r) => r[0] === hz)![2];
		expect(at(80)).toBeNull();
		expect(at(100)).toBeCloseTo(0, 6);
		expect(at(200)).toBeCloseTo(3, 6);
		expect(at(1250)).toBeNull();
	});

	it('has no rows without data', () => {
		expect(responseTable([]).rows).toEqual([]);
	});

	it('reads the same curves once, and other curves or labels afresh', () => {
		const first = responseTable([falling, narrow]);
		expect(responseTable([{ ...falling }, { ...narrow }])).toBe(first);
		const other = responseTable([falling, { ...narrow, db: [10, 0] }]);
		expect(other).not.toBe(first);
		expect(other.rows.find((r) => r[0] === 100)![2]).toBeCloseTo(10, 6);
		expect(responseTable([{ ...falling, label: 'Pos 1 again' }, narrow]).headers[1]).toBe('Pos 1 again (dB)');
		expect(responseTable([narrow, falling]).headers).toEqual(['Frequency (Hz)', 'Pos 2, "mic" (dB)', 'Pos 1 (dB)']);
		expect(responseTable([falling, narrow])).toBe(first);
	});
});

describe('responsePlotData and responseCsvRows', () => {
	it('share one frequency grid and keep every point', () => {
		const a: ResponseSeries = { label: 'A', tone: 'before', freqHz: [50, 100], db: [-1.234, -2] };
		const b: ResponseSeries = { label: 'B', tone: 'after', freqHz: [100, 200], db: [3, 4.567] };
		expect(responsePlotData([a, b]).x).toEqual([50, 100, 200]);
		const csv = responseCsvRows([a, b]);
		expect(csv.headers).toEqual(['Frequency (Hz)', 'A (dB)', 'B (dB)']);
		expect(csv.rows).toEqual([
			[50, -1.23, null],
			[100, -2, 3],
			[200, null, 4.57]
		]);
	});

	it('refuses frequencies a log axis cannot show', () => {
		expect(() => responsePlotData([{ label: 'DC', tone: 'neutral', freqHz: [0, 10], db: [0, 0] }])).toThrow(/must be > 0 Hz/);
	});
});

describe('modesToMark', () => {
	it('keeps the modes at or below the Schroeder frequency, in order', () => {
		// 5 × 4 × 3 m room, Rayleigh's formula at c = 343 m/s: 34.30 (1,0,0), 42.88 (0,1,0), 54.91 (1,1,0), 57.17 (0,0,1), 66.67 (1,0,1) Hz …
		const modes = roomModes({ lengthM: 5, widthM: 4, heightM: 3 }, 200).map((m) => ({ freqHz: m.freqHz, kind: m.kind, label: m.n.join(',') }));
		const marked = modesToMark([...modes].reverse(), 60);
		expect(marked.map((m) => m.label)).toEqual(['1,0,0', '0,1,0', '1,1,0', '0,0,1']);
		expect(marked.map((m) => m.kind)).toEqual(['axial', 'axial', 'tangential', 'axial']);
		// Schroeder frequency 141.4 Hz for T = 0.3 s in this room (2000·√(T/V), Schroeder & Kuttruff, JASA 34:76, 1962): every mode up to it, none above.
		const belowSchroeder = modesToMark(modes, 141.4);
		expect(belowSchroeder.length).toBe(modes.filter((m) => m.freqHz <= 141.4).length);
		expect(Math.max(...belowSchroeder.map((m) => m.freqHz))).toBeLessThanOrEqual(141.4);
		expect(modesToMark(modes, null)).toHaveLength(modes.length); // no Schroeder frequency: all of them
	});
});
