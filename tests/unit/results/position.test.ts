import { describe, expect, it } from 'vitest';
import { analyseImpulseResponse } from '../../../src/lib/analysis/analyse';
import { AnalysisInputError } from '../../../src/lib/analysis/errors';
import { exponentialNoiseDecay } from '../../../src/lib/analysis/synthetic';
import type { AnalysisCurves } from '../../../src/lib/analysis/types';
import { positionFromAnalysis, type PositionMetricsInput } from '../../../src/lib/results/position';

const SAMPLE_RATE = 48000;
const T60_S = 0.5;

// The stored form: the engine's result split into metrics (without curves and warnings) and
// curves, then through JSON as the database keeps them.
const result = analyseImpulseResponse(exponentialNoiseDecay({ t60S: T60_S, durationS: 1.2, sampleRate: SAMPLE_RATE, onsetS: 0.01, noiseDbRePeak: -90, seed: 7 }), SAMPLE_RATE);
const { curves: engineCurves, warnings: _warnings, ...engineMetrics } = result;
const metrics = JSON.parse(JSON.stringify(engineMetrics)) as PositionMetricsInput;
const curves = JSON.parse(JSON.stringify(engineCurves)) as AnalysisCurves;

describe('positionFromAnalysis on a stored engine result', () => {
	const position = positionFromAnalysis(12, ' P1 ', metrics, curves);

	it('carries the capture, the trimmed label and every band of the result', () => {
		expect(position.captureId).toBe(12);
		expect(position.positionLabel).toBe('P1');
		expect(position.bands.map((b) => b.centerHz)).toEqual(result.bands.map((b) => b.centerHz));
		expect(position.bands).toEqual(result.bands);
		expect(position.broadband).toEqual(result.broadband);
		expect(position.peakToNoiseDb).toBe(result.peakToNoiseDb);
		expect(position.reflections).toEqual(result.reflections);
	});

	it('holds a decay of the synthetic T = 0.5 s (closed form EDT = T20 = T30 = T, Cabrera, Xun & Guski 2016)', () => {
		// 5 %: the JND of reverberation time (ISO 3382-1 Annex A, from memory); a noise-driven decay scatters a little.
		expect(Math.abs((position.broadband.t30S ?? NaN) - T60_S) / T60_S).toBeLessThan(0.05);
	});

	it('takes the response and all five smoothings on one grid', () => {
		const n = curves.frequencyResponse.freqHz.length;
		expect(n).toBeGreaterThan(100); // 48 points per octave over ten octaves
		expect(position.response.freqHz).toEqual(curves.frequencyResponse.freqHz);
		expect(position.response.db).toEqual(curves.frequencyResponse.db);
		for (const key of ['1', '3', '6', '12', '24'] as const) {
			expect(position.response.smoothed[key]).toEqual(curves.frequencyResponseSmoothed[key]);
		}
	});

	it('copies the arrays, so later edits of the stored record do not reach it', () => {
		const copy = JSON.parse(JSON.stringify(engineCurves)) as AnalysisCurves;
		const p = positionFromAnalysis(1, 'P', metrics, copy);
		copy.frequencyResponse.db[0] = 999;
		copy.frequencyResponseSmoothed['3'][0] = 999;
		expect(p.response.db[0]).not.toBe(999);
		expect(p.response.smoothed['3'][0]).not.toBe(999);
	});
});

describe('positionFromAnalysis refuses records it cannot use, saying why', () => {
	const withCurves = (change: (c: AnalysisCurves) => void) => {
		const c = JSON.parse(JSON.stringify(engineCurves)) as AnalysisCurves;
		change(c);
		return c;
	};
	it.each([
		{ what: 'a non-integer capture id', id: 1.5, label: 'P1', c: curves, message: /captureId/ },
		{ what: 'an empty label', id: 1, label: '  ', c: curves, message: /label is empty/ },
		{ what: 'levels and frequencies of different lengths', id: 1, label: 'P1', c: withCurves((c) => c.frequencyResponse.db.pop()), message: /frequencies but/ },
		{ what: 'a missing smoothing', id: 1, label: 'P1', c: withCurves((c) => delete (c.frequencyResponseSmoothed as Partial<Record<string, number[]>>)['12']), message: /1\/12-octave/ },
		{ what: 'a smoothing of another length', id: 1, label: 'P1', c: withCurves((c) => c.frequencyResponseSmoothed['6'].pop()), message: /1\/6-octave smoothed response has/ }
	])('$what', ({ id, label, c, message }) => {
		expect(() => positionFromAnalysis(id, label, metrics, c)).toThrow(AnalysisInputError);
		expect(() => positionFromAnalysis(id, label, metrics, c)).toThrow(message);
	});
});
