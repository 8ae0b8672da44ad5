// Synthetic chart data from formulas, for looking at the chart components.
import { roomModes } from '$lib/analysis/room';
import { bs1116Target } from '$lib/analysis/targets';
import type { DecayCurve, SmoothingKey } from '$lib/analysis/types';
import type { DetectedReflection } from '$lib/analysis/reflections';
import type { PageLoad } from './$types';

const FREQS = Array.from({ length: 480 }, (_, i) => 20 * 2 ** (i / 48));
const MODES = roomModes({ lengthM: 5, widthM: 4, heightM: 3 }, 200);

/** Sum of modal resonances (Lorentzian power peaks) plus a gentle tilt, in dB. */
function response(seed: number, damping: number): number[] {
	return FREQS.map((f) => {
		let power = 0.3;
		MODES.slice(0, 20).forEach((m, i) => {
			const weight = 0.5 + 0.5 * Math.cos(seed * 1.7 + i * 2.3);
			const q = m.freqHz / (2 * damping);
			power += (weight * 1.5) / (1 + ((f - m.freqHz) / q) ** 2);
		});
		const ripple = f > 200 ? 2.5 * Math.sin(seed + f / (90 + seed * 7)) : 0;
		return 10 * Math.log10(power) + ripple - (f > 8000 ? 6 * Math.log2(f / 8000) : 0) + 80;
	});
}

/** Moving average over ±1/(2N) octave: a stand-in for the analysis' smoothing. */
function smooth(db: number[], fraction: number): number[] {
	const half = Math.max(1, Math.round(48 / (2 * fraction)));
	return db.map((_, i) => {
		const lo = Math.max(0, i - half);
		const hi = Math.min(db.length - 1, i + half);
		let sum = 0;
		for (let k = lo; k <= hi; k++) sum += 10 ** (db[k] / 10);
		return 10 * Math.log10(sum / (hi - lo + 1));
	});
}

function smoothedSet(db: number[]): Record<SmoothingKey, number[]> {
	return { '1': smooth(db, 1), '3': smooth(db, 3), '6': smooth(db, 6), '12': smooth(db, 12), '24': smooth(db, 24) };
}

/** Schroeder decay of an exponential decay with noise: 10·lg(e^(−kt)) for T, with fitted lines over ISO 3382 ranges. */
function decay(centerHz: number | 'broadband', t60S: number, noiseDb: number): DecayCurve {
	const slope = -60 / t60S;
	const timesS = Array.from({ length: 300 }, (_, i) => (i * 1.5 * t60S) / 299);
	const levelDb = timesS.map((t) => 10 * Math.log10(10 ** ((slope * t) / 10) * (1 - t / (1.6 * t60S)) + 1e-9));
	const line = (topDb: number, bottomDb: number) => ({ startS: -topDb / -slope, endS: -bottomDb / -slope, interceptDb: 0.3, slopeDbPerS: slope * 1.01 });
	return {
		centerHz,
		timesS,
		levelDb,
		noiseDb,
		crosspointS: 1.2 * t60S,
		fits: { edt: line(0, -10), t20: line(-5, -25), t30: line(-5, -35) }
	};
}

const OCTAVES = [63, 125, 250, 500, 1000, 2000, 4000, 8000];
const T_BEFORE = [0.9, 0.54, 1.53, 2.87, 3.39, 2.06, 1.63, 1.1];
const T_AFTER = [0.8, 0.49, 0.85, 0.56, 0.54, 0.54, 0.55, null];

export const load = (() => {
	const before = response(1, 3);
	const after = response(1, 7).map((v) => v - 2);
	const positions = Array.from({ length: 12 }, (_, i) => ({ label: `P${i + 1}`, db: response(i + 2, 4) }));

	const reflections: DetectedReflection[] = [
		{ delayMs: 2.9, levelDb: -3.5, extraPathM: 0.99, surface: 'floor', predictedDelayMs: 2.95 },
		{ delayMs: 4.1, levelDb: -6.2, extraPathM: 1.41, surface: 'ceiling', predictedDelayMs: 4.0 },
		{ delayMs: 4.6, levelDb: -9.8, extraPathM: 1.58, surface: null, predictedDelayMs: null },
		{ delayMs: 7.8, levelDb: -8.1, extraPathM: 2.68, surface: 'left', predictedDelayMs: 7.7 },
		{ delayMs: 12.4, levelDb: -12.5, extraPathM: 4.26, surface: 'back', predictedDelayMs: 12.1 },
		{ delayMs: 19.0, levelDb: -17.0, extraPathM: 6.52, surface: null, predictedDelayMs: null }
	];
	const etcTimes = Array.from({ length: 800 }, (_, i) => i * 0.1);
	const etcLevels = etcTimes.map((t) => {
		let e = 10 ** (-t / 8) * 0.002 * (1 + 0.6 * Math.sin(t * 7.3) ** 2);
		e += Math.exp(-((t / 0.08) ** 2));
		for (const r of reflections) e += 10 ** (r.levelDb / 10) * Math.exp(-(((t - r.delayMs) / 0.08) ** 2));
		return Math.max(-70, 10 * Math.log10(e));
	});

	const wfTimes = Array.from({ length: 31 }, (_, i) => i * 10);
	const wfFreqs = Array.from({ length: 7 * 24 + 1 }, (_, i) => 20 * 2 ** (i / 24));
	const modal = response(3, 3);
	const levelsDb = wfTimes.map((t) =>
		wfFreqs.map((f) => {
			const index = Math.min(FREQS.length - 1, Math.max(0, Math.round(Math.log2(f / 20) * 48)));
			const t60 = 0.25 + 0.6 * Math.exp(-f / 120) + (modal[index] > 82 ? 0.4 : 0);
			return Math.max(-80, modal[index] - 86 - (60 * t) / 1000 / t60);
		})
	);

	return {
		before: { freqHz: FREQS, smoothed: smoothedSet(before) },
		after: { freqHz: FREQS, smoothed: smoothedSet(after) },
		positions: positions.map((p) => ({ label: p.label, freqHz: FREQS, smoothed: smoothedSet(p.db) })),
		modes: MODES.map((m) => ({ freqHz: m.freqHz, kind: m.kind, label: `(${m.n.join(',')})` })),
		schroederHz: 141.4,
		decays: [decay('broadband', 0.62, -68), ...OCTAVES.map((f, i) => decay(f, T_BEFORE[i] / 3, -55 - i * 2))],
		bands: OCTAVES.map((centerHz, i) => ({ centerHz, values: { before: T_BEFORE[i] / 3, after: T_AFTER[i] === null ? null : T_AFTER[i]! / 3, edt: T_BEFORE[i] / 3.3 } })),
		target: bs1116Target(100, OCTAVES),
		etc: { timesMs: etcTimes, levelDb: etcLevels },
		reflections,
		waterfall: { timesMs: wfTimes, freqHz: wfFreqs, levelsDb }
	};
}) satisfies PageLoad;
