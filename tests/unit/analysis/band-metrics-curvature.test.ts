// Curvature C = 100·(T30/T20 − 1) % of a band's decay (ISO 3382-2:2008, Annex B), flagged when
// it exceeds 10 % in size: a T30 shorter than T20 marks a decay that is not one slope as surely
// as a longer one does (the product rule in quality.ts, which applies the Annex's 10 % both ways).
import { describe, expect, it } from 'vitest';
import { analyseDecay } from '../../../src/lib/analysis/band-metrics';

const SAMPLE_RATE = 8000;
const FLOOR_DB = -90;

/**
 * p²(t) falling at 60 dB per T1 down to the kink, at 60 dB per T2 after it, onto a steady floor
 * 90 dB down (far below the 45 dB of decay T30 needs, ISO 3382-1:2009 §5.3.3).
 */
function doubleSlope(t1S: number, t2S: number, kinkDb: number, durationS: number): Float64Array {
	const kinkS = (-kinkDb / 60) * t1S;
	return Float64Array.from({ length: Math.round(durationS * SAMPLE_RATE) }, (_, i) => {
		const t = i / SAMPLE_RATE;
		const levelDb = t < kinkS ? (-60 * t) / t1S : kinkDb - (60 * (t - kinkS)) / t2S;
		return 10 ** (Math.max(levelDb, FLOOR_DB) / 10);
	});
}

/**
 * Hand computation, independent of the code under test: Schroeder's backward integral of that p²
 * in closed form (without the floor), E(t) = (e^(−k1·t) − e^(−k1·tk))/k1 + e^(−k1·tk)/k2 before
 * the kink tk and e^(−k1·tk − k2·(t − tk))/k2 after, fitted by least squares over 10 000 points per
 * second in ISO 3382-1's ranges (T20: −5…−25 dB, T30: −5…−35 dB).
 */
function closedFormT(t1S: number, t2S: number, kinkDb: number, bottomDb: number): number {
	const [k1, k2] = [(6 * Math.LN10) / t1S, (6 * Math.LN10) / t2S];
	const tk = (-kinkDb / 60) * t1S;
	const e = (t: number) => (t < tk ? (Math.exp(-k1 * t) - Math.exp(-k1 * tk)) / k1 + Math.exp(-k1 * tk) / k2 : Math.exp(-k1 * tk - k2 * (t - tk)) / k2);
	const e0 = e(0);
	let [n, sx, sy, sxx, sxy] = [0, 0, 0, 0, 0];
	for (let i = 0; i < 50_000; i++) {
		const t = i / 10_000;
		const y = 10 * Math.log10(e(t) / e0);
		if (y > -5 || y < bottomDb) continue;
		[n, sx, sy, sxx, sxy] = [n + 1, sx + t, sy + y, sxx + t * t, sxy + t * y];
	}
	return -60 / ((n * sxy - sx * sy) / (n * sxx - sx * sx));
}

describe('curvature of a band decay (ISO 3382-2:2008, Annex B)', () => {
	it.each([
		// T1 = 1 s to −20 dB, then 0.4 s: closed form T20 = 0.827 s, T30 = 0.689 s, C = −16.7 %.
		{ t1S: 1, t2S: 0.4, kinkDb: -20, flagged: true, case: 'a faster late decay (C ≈ −17 %, T30 shorter)' },
		// T1 = 1 s to −25 dB, then 2 s: closed form T20 = 1.277 s, T30 = 1.616 s, C = +26.5 %.
		{ t1S: 1, t2S: 2, kinkDb: -25, flagged: true, case: 'a slower late decay (C ≈ +27 %, T30 longer)' },
		// One slope: T20 = T30 = 1 s, C = 0.
		{ t1S: 1, t2S: 1, kinkDb: -25, flagged: false, case: 'one slope (C = 0)' }
	])('$case: T20, T30 and C as computed by hand, flagged $flagged', ({ t1S, t2S, kinkDb, flagged }) => {
		const analysis = analyseDecay(doubleSlope(t1S, t2S, kinkDb, 4), SAMPLE_RATE);
		const t20 = closedFormT(t1S, t2S, kinkDb, -25);
		const t30 = closedFormT(t1S, t2S, kinkDb, -35);
		// Within 0.2 %: the sampled curve and the compensated tail against the continuous closed form.
		expect(Math.abs(analysis.fits.t20!.reverberationTimeS / t20 - 1)).toBeLessThan(0.002);
		expect(Math.abs(analysis.fits.t30!.reverberationTimeS / t30 - 1)).toBeLessThan(0.002);
		const expectedC = 100 * (t30 / t20 - 1);
		expect(Math.abs(analysis.curvaturePct! - expectedC)).toBeLessThan(0.2);
		const curvature = analysis.problems.filter((p) => p.code === 'curvature');
		expect(curvature).toHaveLength(flagged ? 1 : 0);
		if (flagged) expect(curvature[0].message).toMatch(expectedC < 0 ? /T30 is 17 % shorter than T20/ : /T30 is 27 % longer than T20/);
	});
});
