// The demo visit's input chain, calibrated from a calibrator recording made from formulas: a
// steady 1 kHz sine at the level a 94 dB SPL calibrator (IEC 60942) would give through the demo's
// input chain, between two stretches of background noise. Goes through the app's own service, so
// the recording is stored and checked as an uploaded one would be.
import { encodeWav } from '../../src/lib/analysis';
import { createSeededGaussian } from '../../src/lib/analysis/synthetic';
import { calibrate } from '../../src/lib/server/calibrations/service';
import type { Scope } from '../../src/lib/server/auth/access';

/** The demo chain reads the 94 dB calibrator at −28 dBFS (AES17), so dB SPL = dBFS + 122 dB. */
export const DEMO_CALIBRATOR = { statedLevelDbSpl: 94, toneDbfs: -28 } as const;

export function demoCalibratorWav(sampleRate = 48_000): Uint8Array {
	const amplitude = 10 ** (DEMO_CALIBRATOR.toneDbfs / 20); // a sine of amplitude A reads 20·lg A dBFS
	const noise = createSeededGaussian(94);
	const x = new Float64Array(6 * sampleRate);
	const on = 0.8 * sampleRate, off = 5.2 * sampleRate;
	for (let i = 0; i < x.length; i++) {
		x[i] = 3e-5 * noise();
		if (i >= on && i < off) x[i] += amplitude * Math.sin((2 * Math.PI * 1000 * (i - on)) / sampleRate);
	}
	return encodeWav(x, sampleRate, 24);
}

export async function seedDemoCalibration(scope: Scope, sessionId: number): Promise<number> {
	const bytes = demoCalibratorWav();
	const done = await calibrate(
		scope,
		sessionId,
		{ channel: null, label: 'measurement microphone → interface input 1', statedLevelDbSpl: DEMO_CALIBRATOR.statedLevelDbSpl, fileChannel: 0 },
		{ name: 'calibrator-94dB.wav', bytes }
	);
	return done.offsetDb;
}
