// Rectangular-room quantities: dimensions, axial/tangential/oblique modes, Schroeder frequency.
import { AnalysisInputError } from './errors';

export interface RoomBox {
	lengthM: number;
	widthM: number;
	heightM: number;
}

export type ModeKind = 'axial' | 'tangential' | 'oblique';

export interface RoomMode {
	n: [number, number, number];
	freqHz: number;
	kind: ModeKind;
}

/** Largest dimension accepted; anything beyond is a typing error (mm entered as m), not a room. */
export const MAX_ROOM_DIMENSION_M = 200;

/** Upper bound on the number of modes listed, so a wrong input cannot exhaust memory. */
const MAX_MODE_COUNT = 200_000;

const DIMENSIONS: readonly (keyof RoomBox)[] = ['lengthM', 'widthM', 'heightM'];

export function validateRoom(room: RoomBox): void {
	if (room === null || typeof room !== 'object') {
		throw new AnalysisInputError('invalid_option', 'room must be an object with lengthM, widthM and heightM');
	}
	for (const key of DIMENSIONS) {
		const value = room[key];
		if (typeof value !== 'number' || !Number.isFinite(value)) {
			throw new AnalysisInputError('invalid_option', `room ${key} must be a finite number of metres, got ${String(value)}`);
		}
		if (value <= 0) throw new AnalysisInputError('invalid_option', `room ${key} must be greater than 0 m, got ${value}`);
		if (value > MAX_ROOM_DIMENSION_M) {
			throw new AnalysisInputError('invalid_option', `room ${key} of ${value} m exceeds ${MAX_ROOM_DIMENSION_M} m; check the unit`);
		}
	}
}

export function roomVolume(room: RoomBox): number {
	validateRoom(room);
	return room.lengthM * room.widthM * room.heightM;
}

export function roomSurfaceArea(room: RoomBox): number {
	validateRoom(room);
	const { lengthM: l, widthM: w, heightM: h } = room;
	return 2 * (l * w + l * h + w * h);
}

function checkPositive(name: string, value: number): void {
	if (!Number.isFinite(value) || value <= 0) throw new AnalysisInputError('invalid_option', `${name} must be a finite number > 0, got ${value}`);
}

function kindOf(n: readonly [number, number, number]): ModeKind {
	const nonZero = n.filter((index) => index !== 0).length;
	return nonZero === 1 ? 'axial' : nonZero === 2 ? 'tangential' : 'oblique';
}

/** Natural frequencies of a rigid-walled box up to maxFreqHz, sorted by frequency. */
export function roomModes(room: RoomBox, maxFreqHz: number, c = 343): RoomMode[] {
	validateRoom(room);
	checkPositive('maxFreqHz', maxFreqHz);
	checkPositive('speed of sound c', c);
	const expected = expectedModeCount(room, maxFreqHz, c);
	if (expected > MAX_MODE_COUNT) {
		throw new AnalysisInputError('invalid_option', `about ${Math.round(expected)} modes below ${maxFreqHz} Hz; lower maxFreqHz (limit ${MAX_MODE_COUNT} modes)`);
	}
	const { lengthM: l, widthM: w, heightM: h } = room;
	// Index limits from f ≥ c·n/(2·dimension) for any single index.
	const maxX = Math.floor((2 * maxFreqHz * l) / c);
	const maxY = Math.floor((2 * maxFreqHz * w) / c);
	const maxZ = Math.floor((2 * maxFreqHz * h) / c);
	const modes: RoomMode[] = [];
	for (let nx = 0; nx <= maxX; nx++) {
		for (let ny = 0; ny <= maxY; ny++) {
			for (let nz = 0; nz <= maxZ; nz++) {
				if (nx === 0 && ny === 0 && nz === 0) continue;
				// Rayleigh's formula (Kuttruff, Room Acoustics, ch. 3): f = c/2·√((nx/L)² + (ny/W)² + (nz/H)²)
				const freqHz = (c / 2) * Math.hypot(nx / l, ny / w, nz / h);
				if (freqHz > maxFreqHz) continue;
				const n: [number, number, number] = [nx, ny, nz];
				modes.push({ n, freqHz, kind: kindOf(n) });
			}
		}
	}
	return modes.sort(
		(a, b) => a.freqHz - b.freqHz || a.n[0] - b.n[0] || a.n[1] - b.n[1] || a.n[2] - b.n[2]
	);
}

/** Frequency above which modes overlap enough to treat the field statistically. */
export function schroederFrequency(t60S: number, volumeM3: number): number {
	checkPositive('reverberation time t60S', t60S);
	checkPositive('volumeM3', volumeM3);
	// Schroeder & Kuttruff, JASA 34:76, 1962: f_s = 2000·√(T/V)
	return 2000 * Math.sqrt(t60S / volumeM3);
}

/** Asymptotic number of modes with frequency ≤ freqHz (volume, surface and edge terms). */
export function expectedModeCount(room: RoomBox, freqHz: number, c = 343): number {
	validateRoom(room);
	if (!Number.isFinite(freqHz) || freqHz < 0) throw new AnalysisInputError('invalid_option', `freqHz must be a finite number ≥ 0, got ${freqHz}`);
	checkPositive('speed of sound c', c);
	const volume = room.lengthM * room.widthM * room.heightM;
	const surface = roomSurfaceArea(room);
	const edges = 4 * (room.lengthM + room.widthM + room.heightM);
	const k = freqHz / c;
	// Kuttruff, Room Acoustics, ch. 3: N(f) ≈ 4πVf³/(3c³) + πSf²/(4c²) + Lf/(8c)
	return (4 * Math.PI * volume * k ** 3) / 3 + (Math.PI * surface * k ** 2) / 4 + (edges * k) / 8;
}
