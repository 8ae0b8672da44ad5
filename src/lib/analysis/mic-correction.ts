// Microphone correction files: the plain-text form measurement microphones ship with (one
// "frequency level" pair a line), parsed strictly, interpolated at any frequency and applied to a
// magnitude response.

/** One point of a correction: the microphone's deviation from flat at a frequency. */
export interface CorrectionPoint {
	freqHz: number;
	db: number;
}

export interface MicCorrection {
	/** Strictly increasing frequencies, all > 0. */
	points: CorrectionPoint[];
	/** Comment lines as written, without the leading mark (e.g. a serial number or sensitivity). */
	comments: string[];
	/** A first line of column names, when the file has one. */
	header: string | null;
}

/** A correction file that cannot be read; `line` is 1-based (null for the file as a whole). */
export class MicCorrectionError extends Error {
	readonly line: number | null;

	constructor(line: number | null, message: string) {
		super(line === null ? message : `line ${line}: ${message}`);
		this.name = 'MicCorrectionError';
		this.line = line;
	}
}

export function isMicCorrectionError(value: unknown): value is MicCorrectionError {
	return value instanceof MicCorrectionError;
}

/** Lines starting with one of these are comments (common practice, no source). */
export const COMMENT_MARKS = ['*', '#', ';', '"'] as const;
/** A correction is a deviation from flat; beyond this it is an absolute level or a typo (common practice, no source). */
export const MAX_CORRECTION_DB = 50;
/** Files with more points are refused (typical files have a few hundred; common practice, no source). */
export const MAX_CORRECTION_POINTS = 10_000;

const NUMBER = /^[+-]?(\d+\.?\d*|\.\d+)([eE][+-]?\d+)?$/;

/**
 * Parses a correction file: per line a frequency in Hz and a level in dB, then optionally a phase
 * (ignored), separated by whitespace, tabs or commas. Blank lines and comment lines (starting with
 * *, #, ; or ") are skipped; one first line of column names (no number in it) is kept as the
 * header. Frequencies must be > 0 and strictly increasing. Decimal commas are refused rather than
 * guessed. Any other line is an error naming its number.
 */
export function parseMicCorrection(text: string): MicCorrection {
	const lines = text.replace(/^\uFEFF/, '').split(/\r\n|\r|\n/);
	const points: CorrectionPoint[] = [];
	const comments: string[] = [];
	let header: string | null = null;
	let previous: { freqHz: number; line: number } | null = null;
	let seenContent = false;

	for (let index = 0; index < lines.length; index++) {
		const line = index + 1;
		const trimmed = lines[index].trim();
		if (trimmed === '') continue;
		if (COMMENT_MARKS.some((mark) => trimmed.startsWith(mark))) {
			comments.push(trimmed.slice(1).trim());
			continue;
		}
		const fields = trimmed.split(/[\s,]+/).filter((field) => field !== '');
		const isNumber = fields.map((field) => NUMBER.test(field));
		if (!seenContent && !isNumber.some(Boolean) && /[a-z]/i.test(trimmed)) {
			seenContent = true;
			header = trimmed;
			continue;
		}
		seenContent = true;
		if (/\S\s+\S/.test(trimmed) && /\d,\d/.test(trimmed)) {
			throw new MicCorrectionError(line, 'decimal commas are not supported; write 0.5, not 0,5');
		}
		if (fields.length < 2 || fields.length > 3 || !isNumber[0] || !isNumber[1] || (fields.length === 3 && !isNumber[2])) {
			throw new MicCorrectionError(line, `expected a frequency and a level in dB (and optionally a phase), got "${trimmed.slice(0, 60)}"`);
		}
		const freqHz = Number(fields[0]);
		const db = Number(fields[1]);
		if (!Number.isFinite(freqHz) || !(freqHz > 0)) throw new MicCorrectionError(line, `frequency must be above 0 Hz, got ${fields[0]}`);
		if (!Number.isFinite(db) || Math.abs(db) > MAX_CORRECTION_DB) {
			throw new MicCorrectionError(line, `level ${fields[1]} dB is outside ±${MAX_CORRECTION_DB} dB; a correction holds the deviation from flat, not an absolute level`);
		}
		if (previous && !(freqHz > previous.freqHz)) {
			throw new MicCorrectionError(line, `frequency ${fields[0]} Hz is not above the previous one (${previous.freqHz} Hz on line ${previous.line}); frequencies must increase`);
		}
		if (points.length >= MAX_CORRECTION_POINTS) throw new MicCorrectionError(line, `more than ${MAX_CORRECTION_POINTS} points`);
		points.push({ freqHz, db });
		previous = { freqHz, line };
	}

	if (points.length < 2) {
		throw new MicCorrectionError(null, `a correction needs at least two frequencies; the file has ${points.length === 0 ? 'none' : 'one'}`);
	}
	return { points, comments, header };
}

function checkPoints(points: readonly CorrectionPoint[]): void {
	if (points.length === 0) throw new RangeError('the correction has no points');
	for (let i = 0; i < points.length; i++) {
		const { freqHz, db } = points[i];
		if (!(freqHz > 0) || !Number.isFinite(freqHz) || !Number.isFinite(db)) throw new RangeError(`correction point ${i} is not a frequency > 0 and a finite level`);
		if (i > 0 && !(freqHz > points[i - 1].freqHz)) throw new RangeError(`correction frequencies must increase (point ${i})`);
	}
}

/** Correction at one frequency, with points already checked; `from` is where the search may start. */
function interpolate(points: readonly CorrectionPoint[], freqHz: number, from = 0): { db: number; index: number } {
	const last = points.length - 1;
	if (!(freqHz > points[0].freqHz)) return { db: points[0].db, index: 0 };
	if (freqHz >= points[last].freqHz) return { db: points[last].db, index: last };
	let lo = from;
	if (!(points[lo].freqHz <= freqHz)) lo = 0;
	let hi = last;
	while (hi - lo > 1) {
		const mid = (lo + hi) >> 1;
		if (points[mid].freqHz <= freqHz) lo = mid;
		else hi = mid;
	}
	const a = points[lo];
	const b = points[hi];
	const u = Math.log(freqHz / a.freqHz) / Math.log(b.freqHz / a.freqHz);
	return { db: a.db + u * (b.db - a.db), index: lo };
}

/**
 * The correction at a frequency: linear in dB over log frequency between the two nearest points;
 * flat beyond the ends (the first or last point's value), and so at 0 Hz too (common practice, no
 * source: outside its range the file says nothing, and a flat extension adds no invented slope).
 */
export function correctionAt(correction: Pick<MicCorrection, 'points'>, freqHz: number): number {
	checkPoints(correction.points);
	if (Number.isNaN(freqHz)) throw new RangeError('frequency is NaN');
	return interpolate(correction.points, freqHz).db;
}

/** The correction on a frequency grid (any order; fastest ascending). */
export function correctionOnGrid(correction: Pick<MicCorrection, 'points'>, freqHz: readonly number[]): number[] {
	checkPoints(correction.points);
	let index = 0;
	return freqHz.map((f) => {
		if (Number.isNaN(f)) throw new RangeError('frequency is NaN');
		const result = interpolate(correction.points, f, index);
		index = result.index;
		return result.db;
	});
}

/**
 * How the file's numbers relate to the microphone: 'deviation' (the usual form — the microphone's
 * response relative to flat, subtracted from a measurement) or 'correction' (what to add).
 */
export type CorrectionSense = 'deviation' | 'correction';

/**
 * A magnitude response with the microphone taken out: measured − deviation (or + correction).
 * Returns new arrays; the grid is kept. Frequencies outside the file's range get its end values.
 */
export function applyMicCorrection(
	response: { freqHz: readonly number[]; db: readonly number[] },
	correction: Pick<MicCorrection, 'points'>,
	sense: CorrectionSense = 'deviation'
): { freqHz: number[]; db: number[] } {
	if (response.freqHz.length !== response.db.length) {
		throw new RangeError(`response has ${response.freqHz.length} frequencies but ${response.db.length} levels`);
	}
	const sign = sense === 'deviation' ? -1 : 1;
	const values = correctionOnGrid(correction, response.freqHz);
	return { freqHz: [...response.freqHz], db: response.db.map((level, k) => level + sign * values[k]) };
}

/** The frequency range the file covers; outside it the correction is extended flat. */
export function correctionRangeHz(correction: Pick<MicCorrection, 'points'>): { lowHz: number; highHz: number } {
	checkPoints(correction.points);
	return { lowHz: correction.points[0].freqHz, highHz: correction.points[correction.points.length - 1].freqHz };
}
