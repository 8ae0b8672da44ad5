// Numbers of a plan as people read them, in the user's units: millimetres or inches with
// sixteenths for lengths, m² or ft² for areas, kg or lb for weights. Frequencies, times and
// changes are written by $lib/format.
import { formatInches, mmToInches, type LengthUnit } from '../treatment/units';

/** 1 ft = 0.3048 m and 1 lb = 0.45359237 kg exactly (international yard and pound, 1959). */
export const M2_PER_FT2 = 0.3048 ** 2;
export const KG_PER_LB = 0.45359237;

const trimmed = (v: number, decimals: number) => String(Number(v.toFixed(decimals)));

/** "196 mm", "6.5 mm", "7 11/16″". */
export function lengthText(mm: number, unit: LengthUnit): string {
	return unit === 'in' ? formatInches(mmToInches(mm)) : `${trimmed(mm, 1)} mm`;
}

/**
 * A board thickness: mm to 0.1, inches to 1/32″ — a caliper's 15/32″ is not a sixteenth, and a
 * sheet sold as 1/2″ must not read as 1/2″ when it measures less.
 */
export function thicknessText(mm: number, unit: LengthUnit): string {
	return unit === 'in' ? formatInches(mmToInches(mm), 32) : `${trimmed(mm, 1)} mm`;
}

const NUMBER = String.raw`\d+(?:\.\d+)?`;
/** "12 × 34 × 5 mm", "12 × 34 mm", "0, 49, 196 mm" or "138 mm": the numbers before one "mm". */
const MM_RUN = new RegExp(String.raw`(?<![\w.])(${NUMBER}(?:(?: × |, )${NUMBER})*) mm\b`, 'g');

/**
 * A sentence written in millimetres (part names, notes, build steps) in the user's unit: with
 * inches, every "N mm" — and each number of "A × B mm" or "A, B, C mm" — becomes inches to 1/16″.
 */
export function localiseLengths(text: string, unit: LengthUnit): string {
	if (unit !== 'in') return text;
	return text.replace(MM_RUN, (_, run: string) => run.replace(new RegExp(NUMBER, 'g'), (n) => lengthText(Number(n), 'in')));
}

/** A length as a form shows it, so that submitting it unchanged gives the same length back. */
export function lengthInput(mm: number, unit: LengthUnit): string {
	if (unit === 'in') return formatInches(mmToInches(mm), 32).replace('″', ' in');
	return `${trimmed(mm, 1)} mm`;
}

/** "1.20 × 0.60 m" / "47 1/4″ × 23 5/8″" for a unit's face. */
export function sizeText(widthMm: number, heightMm: number, unit: LengthUnit): string {
	return `${lengthText(widthMm, unit)} × ${lengthText(heightMm, unit)}`;
}

export function areaText(m2: number, unit: LengthUnit): string {
	return unit === 'in' ? `${(m2 / M2_PER_FT2).toFixed(1)} ft²` : `${m2.toFixed(2)} m²`;
}

/** Room-scale lengths (surfaces, openings): metres, or feet and inches. */
export function roomLengthText(m: number, unit: LengthUnit): string {
	if (unit !== 'in') return `${m.toFixed(2)} m`;
	const inches = Math.round(mmToInches(m * 1000));
	return `${Math.floor(inches / 12)}′ ${inches % 12}″`;
}

export function weightText(kg: number, unit: LengthUnit): string {
	return unit === 'in' ? `${(kg / KG_PER_LB).toFixed(1)} lb` : `${kg.toFixed(1)} kg`;
}

export function moneyText(amount: number, currency: string): string {
	try {
		return new Intl.NumberFormat('en', { style: 'currency', currency }).format(amount);
	} catch {
		return `${amount.toFixed(2)} ${currency}`;
	}
}
