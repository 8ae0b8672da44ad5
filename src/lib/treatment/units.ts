// Lengths: millimetres internally, shown in mm or in inches with sixteenths.

/** 1 in = 25.4 mm exactly (international inch, 1959). */
export const MM_PER_INCH = 25.4;

export type LengthUnit = 'mm' | 'in';

export const mmToInches = (mm: number): number => mm / MM_PER_INCH;
export const inchesToMm = (inches: number): number => inches * MM_PER_INCH;

const INCH_MARK = '″';

function gcd(a: number, b: number): number {
	return b === 0 ? a : gcd(b, a % b);
}

/** Inches rounded to the nearest 1/denominator, written "7 3/4″", "1/2″", "12″". */
export function formatInches(inches: number, denominator = 16): string {
	if (!Number.isFinite(inches)) throw new Error(`cannot format ${inches} inches`);
	if (!Number.isInteger(denominator) || denominator < 1) throw new Error(`fraction denominator must be a positive integer, got ${denominator}`);
	const sign = inches < 0 ? '−' : '';
	const steps = Math.round(Math.abs(inches) * denominator);
	const whole = Math.floor(steps / denominator);
	const rest = steps % denominator;
	if (rest === 0) return `${sign}${whole}${INCH_MARK}`;
	const g = gcd(rest, denominator);
	const fraction = `${rest / g}/${denominator / g}`;
	return whole === 0 ? `${sign}${fraction}${INCH_MARK}` : `${sign}${whole} ${fraction}${INCH_MARK}`;
}

/**
 * A room-scale length in feet and inches, the inches rounded to the nearest 1/denominator:
 * "12′ 6 1/2″", "17′ 0″", and under a foot just the inches ("6 1/4″"). `ascii` writes the marks
 * as typed on a keyboard ("12' 6 1/2""), for form fields.
 */
export function formatFeetAndInches(mm: number, denominator = 16, opts: { ascii?: boolean } = {}): string {
	if (!Number.isFinite(mm)) throw new Error(`cannot format ${mm} mm`);
	if (!Number.isInteger(denominator) || denominator < 1) throw new Error(`fraction denominator must be a positive integer, got ${denominator}`);
	const sign = mm < 0 ? '−' : '';
	// Rounded once, in steps of the fraction, so 11 31/32″ carries into the next foot.
	const steps = Math.round(Math.abs(mmToInches(mm)) * denominator);
	const perFoot = 12 * denominator;
	const feet = Math.floor(steps / perFoot);
	const rest = steps - feet * perFoot;
	let inches = formatInches(rest / denominator, denominator);
	if (opts.ascii) inches = inches.replace(INCH_MARK, '"');
	if (feet === 0) return `${sign}${inches}`;
	// "17′ 0 3/4″", as a tape reads, not "17′ 3/4″".
	if (rest > 0 && rest < denominator) inches = `0 ${inches}`;
	return `${sign}${feet}${opts.ascii ? "'" : FOOT_MARK} ${inches}`;
}

/** Millimetres rounded to `decimals` places, written "196 mm". */
export function formatMillimetres(mm: number, decimals = 0): string {
	if (!Number.isFinite(mm)) throw new Error(`cannot format ${mm} mm`);
	const text = mm.toFixed(decimals);
	return `${text.startsWith('-') ? '−' + text.slice(1) : text} mm`;
}

/** A length held in mm, shown in the chosen unit. */
export function formatLength(mm: number, unit: LengthUnit): string {
	if (unit === 'mm') return formatMillimetres(mm);
	if (unit === 'in') return formatInches(mmToInches(mm));
	throw new Error(`unknown length unit "${String(unit)}"`);
}

/** 1 ft = 12 in = 304.8 mm exactly (the same agreement). */
export const MM_PER_FOOT = 12 * MM_PER_INCH;

const FOOT_MARK = '′';

const UNIT_TO_MM: Record<string, number> = {
	mm: 1,
	cm: 10,
	m: 1000,
	in: MM_PER_INCH,
	inch: MM_PER_INCH,
	inches: MM_PER_INCH,
	'"': MM_PER_INCH,
	'”': MM_PER_INCH, // a phone's "smart" double quote
	[INCH_MARK]: MM_PER_INCH,
	ft: MM_PER_FOOT,
	foot: MM_PER_FOOT,
	feet: MM_PER_FOOT,
	"'": MM_PER_FOOT,
	'’': MM_PER_FOOT, // a phone's "smart" apostrophe
	[FOOT_MARK]: MM_PER_FOOT
};

// number, or whole + fraction ("7 3/4", "7-3/4"), or a fraction ("3/4"); then an optional unit.
const LENGTH_PATTERN =
	/^(?:(\d+(?:\.\d*)?|\.\d+)(?:(?:\s+|-)(\d+)\/(\d+))?|(\d+)\/(\d+))\s*(mm|cm|m|inches|inch|in|feet|foot|ft|"|”|″|'|’|′)?$/i;

// Feet and then inches: "12' 6"", "12 ft 6 in", "12'6", "12 ft 6 1/2" (the inches as above).
const FEET_AND_INCHES = /^(\d+(?:\.\d*)?)\s*(?:feet|foot|ft|'|’|′)\s*(?=\S)(.+)$/i;

/**
 * Parses "196mm", "19.6 cm", "7.75in", "7 3/4", "7-3/4″", "1/2", "12 ft", "12' 6"",
 * "12 ft 6 1/2 in" into millimetres. A value without a unit takes `defaultUnit`; a fraction
 * without a unit is read as inches, and so are the figures after a number of feet.
 */
export function parseLength(input: string, defaultUnit: LengthUnit = 'mm'): number {
	const text = input.trim().replace(/,/g, '.');
	if (text === '') throw new Error('enter a length, e.g. "196 mm" or "7 3/4 in"');
	if (text.startsWith('-') || text.startsWith('−')) throw new Error(`"${input}": a length cannot be negative`);
	const feetAndInches = FEET_AND_INCHES.exec(text);
	if (feetAndInches) {
		const [, feet, rest] = feetAndInches;
		if (!/^\d+$/.test(feet)) throw new Error(`"${input}": write whole feet before the inches, e.g. "12' 6""`);
		if (/^(?:-|−)/.test(rest.trim())) throw new Error(`"${input}": a length cannot be negative`);
		if (!/^[\d.\s/-]+(?:inches|inch|in|"|”|″)?$/i.test(rest.trim())) throw new Error(`"${input}": after the feet, give inches, e.g. "12' 6""`);
		const inchesMm = parseLength(rest, 'in');
		if (inchesMm >= MM_PER_FOOT) throw new Error(`"${input}": the inches after the feet must be below 12`);
		return Number(feet) * MM_PER_FOOT + inchesMm;
	}
	const m = LENGTH_PATTERN.exec(text);
	if (!m) throw new Error(`"${input}" is not a length; write e.g. "196 mm", "19.6 cm", "7.75 in", "7 3/4" or "12' 6""`);
	const [, numberPart, mixedNum, mixedDen, fracNum, fracDen, unitRaw] = m;
	const hasFraction = mixedNum !== undefined || fracNum !== undefined;
	let value: number;
	if (fracNum !== undefined) {
		if (Number(fracDen) === 0) throw new Error(`"${input}": the fraction has a zero denominator`);
		value = Number(fracNum) / Number(fracDen);
	} else {
		value = Number(numberPart);
		if (mixedNum !== undefined) {
			if (!/^\d+$/.test(numberPart)) throw new Error(`"${input}": write a whole number before the fraction, e.g. "7 3/4"`);
			if (Number(mixedDen) === 0) throw new Error(`"${input}": the fraction has a zero denominator`);
			if (Number(mixedNum) >= Number(mixedDen)) throw new Error(`"${input}": the fraction after the whole number must be below 1`);
			value += Number(mixedNum) / Number(mixedDen);
		}
	}
	const unit = unitRaw?.toLowerCase();
	if (hasFraction && unit !== undefined && UNIT_TO_MM[unit] === MM_PER_FOOT) {
		throw new Error(`"${input}": give the part of a foot in inches, e.g. "12' 6""`);
	}
	if (hasFraction && unit !== undefined && UNIT_TO_MM[unit] !== MM_PER_INCH) {
		throw new Error(`"${input}": fractions are for inches; write metric lengths as decimals`);
	}
	const factor = unit !== undefined ? UNIT_TO_MM[unit] : hasFraction ? MM_PER_INCH : defaultUnit === 'in' ? MM_PER_INCH : 1;
	return value * factor;
}
