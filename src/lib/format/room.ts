// Room geometry and absorption coefficients as people read them, in the reader's unit system.
// Stored in SI (metres, m², m³; lengths to the millimetre). Metric: room sizes to the
// centimetre, volumes and areas to a tenth. Imperial: feet and inches to the nearest 1/16″ —
// half a step is 0.79 mm, more than the 0.5 mm a stored length can be off, so a length typed in
// inches to a sixteenth reads back as typed — and ft², ft³ whole. 1 in = 25.4 mm, 1 ft =
// 0.3048 m exactly (international yard and pound agreement, 1959; NIST SP 811, Appendix B).
import { formatNumber } from './number';
import { formatFeetAndInches, MM_PER_FOOT } from '../treatment/units';

export interface RoomSize {
	lengthM: number;
	widthM: number;
	heightM: number;
}

/** The user's choice on the account page. */
export type UnitSystem = 'metric' | 'imperial';

const M_PER_FT = MM_PER_FOOT / 1000;
/** Room lengths in feet and inches: to the sixteenth, on pages, in the report and in forms. */
const ROOM_INCH_DENOMINATOR = 16;

/** "5.20 m" or "17′ 0 3/4″". */
export function formatRoomLength(m: number, system: UnitSystem = 'metric'): string {
	return system === 'imperial' ? formatFeetAndInches(m * 1000, ROOM_INCH_DENOMINATOR) : `${formatNumber(m, 2)} m`;
}

/** "5.20 × 3.80 × 2.60" (length × width × height, metres, no unit); in feet and inches each carries its marks. */
export function formatRoomSizeBare(room: RoomSize, system: UnitSystem = 'metric'): string {
	if (system === 'imperial') return [room.lengthM, room.widthM, room.heightM].map((m) => formatRoomLength(m, system)).join(' × ');
	return `${formatNumber(room.lengthM, 2)} × ${formatNumber(room.widthM, 2)} × ${formatNumber(room.heightM, 2)}`;
}

/** "5.20 × 3.80 × 2.60 m", or "17′ 0 3/4″ × 12′ 5 1/2″ × 8′ 6 1/4″". */
export function formatRoomSize(room: RoomSize, system: UnitSystem = 'metric'): string {
	return system === 'imperial' ? formatRoomSizeBare(room, system) : `${formatRoomSizeBare(room)} m`;
}

/** "51.4 m³" or "1815 ft³". */
export function formatVolume(volumeM3: number, system: UnitSystem = 'metric'): string {
	return system === 'imperial' ? `${formatNumber(volumeM3 / M_PER_FT ** 3, 0)} ft³` : `${formatNumber(volumeM3, 1)} m³`;
}

/** "38.2 m²" or "411 ft²". */
export function formatArea(areaM2: number, system: UnitSystem = 'metric'): string {
	return system === 'imperial' ? `${formatNumber(areaM2 / M_PER_FT ** 2, 0)} ft²` : `${formatNumber(areaM2, 1)} m²`;
}

/** The unit a table column of room lengths is headed with: "m" or "ft, in". */
export function roomLengthUnit(system: UnitSystem = 'metric'): string {
	return system === 'imperial' ? 'ft, in' : 'm';
}

/** Form fields in feet and inches: to 1/32″, whose half step (0.40 mm) is under the half millimetre a stored length is rounded to. */
const INPUT_INCH_DENOMINATOR = 32;

/**
 * A room-scale length as a form field shows it, so that sending it back unchanged gives the
 * stored length (to the millimetre) again: metres to the millimetre ("5.2"), or feet and inches
 * to 1/32″ with keyboard marks ("17' 0 3/4"") — a length typed in inches reads back as typed.
 */
export function roomLengthInput(m: number | null | undefined, system: UnitSystem = 'metric'): string {
	if (m === null || m === undefined || !Number.isFinite(m)) return '';
	return system === 'imperial' ? formatFeetAndInches(m * 1000, INPUT_INCH_DENOMINATOR, { ascii: true }) : String(Number(m.toFixed(3)));
}

/** An absorption coefficient to two decimals, as handbook tables give them: "0.35". */
export function formatCoefficient(alpha: number): string {
	return formatNumber(alpha, 2);
}
