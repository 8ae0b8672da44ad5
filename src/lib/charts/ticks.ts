// Axis ticks: octave ticks on log-frequency axes, their labels, and dB tick steps.
import { formatHzAxis, roundSignificant } from '../format';

/** Nominal octave mid-band frequencies, ISO 266 (the values printed on octave axes). */
export const OCTAVE_TICKS_HZ = [16, 31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000, 16000] as const;

/** Octave ticks that fall inside [minHz, maxHz]. */
export function octaveTicks(minHz: number, maxHz: number): number[] {
	if (!(minHz > 0) || !(maxHz > minHz)) throw new RangeError(`need 0 < minHz < maxHz, got ${minHz}…${maxHz}`);
	// 0.5 % slack so a range drawn from exactly 31.5 Hz still shows its first tick.
	return OCTAVE_TICKS_HZ.filter((f) => f >= minHz * 0.995 && f <= maxHz * 1.005);
}

/**
 * Every how many octaves a label fits: the smallest stride whose spacing holds the widest label.
 * Labels stay anchored on 1 kHz so thinned axes keep 1k, 250, 63 … or 1k, 125 ….
 */
export function octaveLabelStride(pxPerOctave: number, labelWidthPx: number): number {
	if (!(pxPerOctave > 0) || !(labelWidthPx > 0)) throw new RangeError('pixel sizes must be > 0');
	return Math.max(1, Math.ceil(labelWidthPx / pxPerOctave));
}

/** Labels for octave ticks, "" for the ticks the stride skips. */
export function octaveTickLabels(ticksHz: readonly number[], stride: number): string[] {
	if (!Number.isInteger(stride) || stride < 1) throw new RangeError(`stride must be an integer ≥ 1, got ${stride}`);
	return ticksHz.map((f) => {
		const octavesFrom1k = Math.round(Math.log2(f / 1000));
		return octavesFrom1k % stride === 0 ? formatHzAxis(f) : '';
	});
}

/**
 * Smallest step of the 1-2-5 series that splits `span` into at most `maxTicks` intervals
 * (the "nice numbers" of Heckbert, Graphics Gems, 1990, rounded up instead of to nearest).
 */
export function niceStep(span: number, maxTicks: number): number {
	if (!(span > 0) || !Number.isFinite(span)) throw new RangeError(`span must be a finite number > 0, got ${span}`);
	if (!Number.isInteger(maxTicks) || maxTicks < 1) throw new RangeError(`maxTicks must be an integer ≥ 1, got ${maxTicks}`);
	const raw = span / maxTicks;
	const decade = 10 ** Math.floor(Math.log10(raw));
	for (const mantissa of [1, 2, 5, 10]) {
		// 1e-9 relative slack: 60/6 must give 10, not 20, despite rounding in raw.
		if (mantissa * decade >= raw * (1 - 1e-9)) return mantissa * decade;
	}
	return 10 * decade;
}

/** dB step for an axis of `plotPx` pixels: whole decibels, ticks at least `minPxPerTick` apart. */
export function dbTickStep(spanDb: number, plotPx: number, minPxPerTick = 28): number {
	if (!(plotPx > 0)) throw new RangeError(`plot size must be > 0 px, got ${plotPx}`);
	const maxTicks = Math.max(1, Math.floor(plotPx / minPxPerTick));
	return Math.max(1, niceStep(spanDb, maxTicks));
}

/** Multiples of step inside [min, max]. */
export function linearTicks(min: number, max: number, step: number): number[] {
	if (!(step > 0) || !(max >= min)) throw new RangeError(`need step > 0 and max ≥ min, got ${min}…${max} step ${step}`);
	const ticks: number[] = [];
	const slack = step * 1e-9;
	for (let k = Math.ceil((min - slack) / step); k * step <= max + slack; k++) {
		const value = k * step;
		ticks.push(Math.abs(value) < slack ? 0 : roundSignificant(value, 12));
	}
	return ticks;
}

/** [min, max] widened outwards to multiples of step; a flat range gets one step either side. */
export function paddedRange(min: number, max: number, step: number): [number, number] {
	if (!(step > 0) || !Number.isFinite(min) || !Number.isFinite(max) || max < min) {
		throw new RangeError(`need finite min ≤ max and step > 0, got ${min}…${max} step ${step}`);
	}
	let lo = Math.floor(min / step) * step;
	let hi = Math.ceil(max / step) * step;
	if (hi - lo < step) {
		lo -= step;
		hi += step;
	}
	return [lo, hi];
}
