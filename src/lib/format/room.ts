// Room geometry and absorption coefficients as people read them. Room sizes are entered to the
// centimetre, so they show to the centimetre; volumes and areas to a tenth.
import { formatNumber } from './number';

export interface RoomSize {
	lengthM: number;
	widthM: number;
	heightM: number;
}

/** "5.20 × 3.80 × 2.60" (length × width × height, metres, no unit). */
export function formatRoomSizeBare(room: RoomSize): string {
	return `${formatNumber(room.lengthM, 2)} × ${formatNumber(room.widthM, 2)} × ${formatNumber(room.heightM, 2)}`;
}

/** "5.20 × 3.80 × 2.60 m". */
export function formatRoomSize(room: RoomSize): string {
	return `${formatRoomSizeBare(room)} m`;
}

/** "51.4 m³". */
export function formatVolume(volumeM3: number): string {
	return `${formatNumber(volumeM3, 1)} m³`;
}

/** "38.2 m²". */
export function formatArea(areaM2: number): string {
	return `${formatNumber(areaM2, 1)} m²`;
}

/** An absorption coefficient to two decimals, as handbook tables give them: "0.35". */
export function formatCoefficient(alpha: number): string {
	return formatNumber(alpha, 2);
}
