// WAV files for pipeline tests, made from formulas (an exponential decay of known T).
import { createHash } from 'node:crypto';
import { encodeWav } from '../../src/lib/analysis';
import { exponentialNoiseDecay } from '../../src/lib/analysis/synthetic';

export function decayWav(options: { t60S?: number; durationS?: number; seed?: number; sampleRate?: number; noiseDbRePeak?: number } = {}): Uint8Array {
	const sampleRate = options.sampleRate ?? 48_000;
	const x = exponentialNoiseDecay({
		t60S: options.t60S ?? 0.5,
		durationS: options.durationS ?? 1.5,
		sampleRate,
		onsetS: 0.01,
		noiseDbRePeak: options.noiseDbRePeak ?? -80,
		seed: options.seed ?? 7
	});
	let peak = 0;
	for (const v of x) peak = Math.max(peak, Math.abs(v));
	for (let i = 0; i < x.length; i++) x[i] *= 0.5 / peak;
	return encodeWav(x, sampleRate, 24);
}

export const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');
