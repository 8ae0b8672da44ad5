// Input levels for the measurement page: the live meter, and the verdict of a level check.
// Levels are dBFS by AES17 (a sine whose peak just reaches full scale reads 0 dBFS; peaks are
// 20·lg|x|). Clipping is the engine's rule, so the page refuses what the analysis would flag.
import { dbfsFromRms } from '../analysis/calibration';
import { CLIP_LEVEL, CLIP_MIN_RUN, detectClipping } from '../analysis/wav';

/** Shown for silence and below: the meter's floor. */
export const METER_FLOOR_DBFS = -90;
/** A peak below this leaves too little above the background for a clean decay (common practice, no source). */
export const TOO_QUIET_PEAK_DBFS = -30;
/** A peak above this leaves less than 1 dB of headroom: clipping is near (common practice, no source). */
export const NEAR_FULL_SCALE_DBFS = -1;
/** How long the meter keeps showing a clip once it happened, so a short one is seen (common practice, no source). */
export const CLIP_HOLD_S = 2;
/** How long the meter's peak marker holds before it falls (common practice, no source). */
export const PEAK_HOLD_S = 1;

export interface BlockLevels {
	/** Largest |sample|, dBFS (floored). */
	peakDbfs: number;
	/** RMS by AES17, dBFS (floored). */
	rmsDbfs: number;
	/** Runs of samples at full scale by the engine's clipping rule. */
	clipRuns: number;
}

const floored = (db: number) => (Number.isFinite(db) ? Math.max(METER_FLOOR_DBFS, db) : METER_FLOOR_DBFS);

/** Peak, RMS and clipping of one block of samples. */
export function blockLevels(samples: Float32Array | Float64Array): BlockLevels {
	let peak = 0;
	let sum = 0;
	for (let i = 0; i < samples.length; i++) {
		const a = Math.abs(samples[i]);
		if (a > peak) peak = a;
		sum += samples[i] * samples[i];
	}
	const rms = samples.length ? Math.sqrt(sum / samples.length) : 0;
	const clipRuns = samples.length >= CLIP_MIN_RUN ? detectClipping(Float64Array.from(samples), CLIP_LEVEL, CLIP_MIN_RUN).runs : 0;
	return { peakDbfs: floored(20 * Math.log10(peak)), rmsDbfs: floored(dbfsFromRms(rms)), clipRuns };
}

/**
 * The live meter's state: the latest block's levels, a peak marker that holds for PEAK_HOLD_S and
 * a clip lamp that stays lit for CLIP_HOLD_S. Time is counted in samples of the input, so the
 * meter holds the same on a slow or a fast page.
 */
export class MeterState {
	peakDbfs = METER_FLOOR_DBFS;
	rmsDbfs = METER_FLOOR_DBFS;
	heldPeakDbfs = METER_FLOOR_DBFS;
	private heldAt = -Infinity;
	private clippedAt = -Infinity;
	private now = 0;

	constructor(private readonly sampleRate: number) {
		if (!(sampleRate > 0)) throw new RangeError(`sample rate must be positive, got ${sampleRate}`);
	}

	/** Take one block of the input. */
	push(samples: Float32Array | Float64Array): void {
		const levels = blockLevels(samples);
		this.now += samples.length;
		this.peakDbfs = levels.peakDbfs;
		this.rmsDbfs = levels.rmsDbfs;
		if (levels.peakDbfs >= this.heldPeakDbfs || this.now - this.heldAt > PEAK_HOLD_S * this.sampleRate) {
			this.heldPeakDbfs = levels.peakDbfs;
			this.heldAt = this.now;
		}
		if (levels.clipRuns > 0) this.clippedAt = this.now;
	}

	/** The input clipped within the last CLIP_HOLD_S. */
	get clipping(): boolean {
		return this.now - this.clippedAt <= CLIP_HOLD_S * this.sampleRate;
	}
}

export type LevelVerdict = 'clipping' | 'near-full-scale' | 'too-quiet' | 'good';

export interface LevelCheckFigures {
	/** Peak of the input while the test signal's response came in, dBFS. */
	peakDbfs: number;
	clipRuns: number;
}

/** What a level check says: clipping refuses the measurement; the others are advice. */
export function levelVerdict(f: LevelCheckFigures): LevelVerdict {
	if (f.clipRuns > 0) return 'clipping';
	if (f.peakDbfs > NEAR_FULL_SCALE_DBFS) return 'near-full-scale';
	if (f.peakDbfs < TOO_QUIET_PEAK_DBFS) return 'too-quiet';
	return 'good';
}

/** The sentence the page shows for a verdict. */
export function verdictMessage(v: LevelVerdict): string {
	switch (v) {
		case 'clipping':
			return 'The input clipped: turn the input gain or the playback volume down and check again. The measurement stays locked until a check passes without clipping.';
		case 'near-full-scale':
			return 'The peak is within 1 dB of full scale: turn the input gain down a little to leave headroom.';
		case 'too-quiet':
			return `The test signal arrives below ${TOO_QUIET_PEAK_DBFS} dBFS: raise the playback volume in small steps (or the input gain) and check again, or the decay may not rise far enough above the background.`;
		case 'good':
			return 'The level is good.';
	}
}
