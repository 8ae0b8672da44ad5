import { describe, expect, it } from 'vitest';
import { alignBandLevels, levelAxisLabel, type PositionBandLevels } from '../../../src/lib/analysis/level-alignment';

// Sums and logs of a few numbers: round-off only.
const ROUND_OFF = 1e-9;

const bands = (levels: Record<number, number | null>) => Object.entries(levels).map(([centerHz, levelDb]) => ({ centerHz: Number(centerHz), levelDb }));

describe('levelAxisLabel', () => {
	it('says dB SPL only for calibrated levels', () => {
		expect(levelAxisLabel(true)).toBe('dB SPL');
		expect(levelAxisLabel(false)).toBe('dB (relative)');
	});
});

describe('alignBandLevels: every chain calibrated', () => {
	const positions: PositionBandLevels[] = [
		{ positionLabel: 'P1', bands: bands({ 500: -30, 1000: -34 }), calibrationOffsetDb: 110 },
		{ positionLabel: 'P2', bands: bands({ 500: -10, 1000: -24 }), calibrationOffsetDb: 100 }
	];
	const aligned = alignBandLevels(positions);

	it('adds each position’s own offset: dB SPL = dBFS + offset', () => {
		expect(aligned.mode).toBe('calibrated');
		expect(aligned.axisLabel).toBe('dB SPL');
		expect(aligned.referenceHz).toBeNull();
		expect(aligned.positions).toEqual([
			{ positionLabel: 'P1', bands: bands({ 500: 80, 1000: 76 }) },
			{ positionLabel: 'P2', bands: bands({ 500: 90, 1000: 76 }) }
		]);
	});

	it('power-averages the levels: 80 and 90 dB → 10·lg((10⁸ + 10⁹)/2) = 87.404 dB', () => {
		expect(Math.abs((aligned.average[0].levelDb ?? NaN) - 10 * Math.log10((1e8 + 1e9) / 2))).toBeLessThan(ROUND_OFF);
		expect(aligned.average[0].count).toBe(2);
		expect(Math.abs((aligned.average[1].levelDb ?? NaN) - 76)).toBeLessThan(ROUND_OFF);
	});

	it('says so in the caption', () => {
		expect(aligned.description).toMatch(/dB SPL from calibrated input chains/);
	});

	it('normalises anyway when asked, to compare shapes', () => {
		const shapes = alignBandLevels(positions, { normalise: true });
		expect(shapes.mode).toBe('normalised');
		expect(shapes.axisLabel).toBe('dB (relative)');
		expect(shapes.positions[1].bands).toEqual(bands({ 500: 14, 1000: 0 }));
		expect(shapes.description).toMatch(/for comparing shapes/);
	});
});

describe('alignBandLevels: a chain not calibrated → all normalised at the 1 kHz octave', () => {
	// One capture recorded 25 dB lower with the same spectrum: unaligned it would pull the
	// average down; normalised, both positions read the same shape.
	const positions: PositionBandLevels[] = [
		{ positionLabel: 'P1', bands: bands({ 250: -20, 1000: -26, 4000: -30 }), calibrationOffsetDb: 110 },
		{ positionLabel: 'P2', bands: bands({ 250: -45, 1000: -51, 4000: -55 }), calibrationOffsetDb: null },
		{ positionLabel: 'P3', bands: bands({ 250: -30, 1000: null, 4000: -40 }), calibrationOffsetDb: null }
	];
	const aligned = alignBandLevels(positions);

	it('sets each position to 0 dB in the reference band', () => {
		expect(aligned.mode).toBe('normalised');
		expect(aligned.axisLabel).toBe('dB (relative)');
		expect(aligned.referenceHz).toBe(1000);
		expect(aligned.positions.map((p) => p.bands)).toEqual([bands({ 250: 6, 1000: 0, 4000: -4 }), bands({ 250: 6, 1000: 0, 4000: -4 })]);
		expect(aligned.average.map((b) => b.levelDb)).toEqual([6, 0, -4].map((v) => expect.closeTo(v, 9)));
	});

	it('leaves out a position without a level in the reference band, and says why', () => {
		expect(aligned.excluded).toEqual([{ positionLabel: 'P3', reason: 'no level in the 1 kHz band to normalise to' }]);
	});

	it('names the reference band and why the levels are relative', () => {
		expect(aligned.description).toBe('Relative levels: each position set to 0 dB in the 1 kHz band before averaging, as 2 positions are not calibrated.');
	});

	it('matches nominal and exact band centres (reference 501.19 Hz finds the 500 Hz band)', () => {
		const exact = alignBandLevels(
			[{ positionLabel: 'P1', bands: [{ centerHz: 250, levelDb: -20 }, { centerHz: 500, levelDb: -26 }], calibrationOffsetDb: null }],
			{ referenceHz: 501.187 }
		);
		expect(exact.positions[0].bands[0].levelDb).toBeCloseTo(6, 9);
		expect(exact.excluded).toEqual([]);
	});

	it('refuses a non-finite offset or a bad band centre', () => {
		expect(() => alignBandLevels([{ positionLabel: 'P1', bands: [], calibrationOffsetDb: Number.NaN }])).toThrow(/offset/);
		expect(() => alignBandLevels([{ positionLabel: 'P1', bands: bands({ 0: 1 }), calibrationOffsetDb: null }])).toThrow(/centre/);
	});
});
