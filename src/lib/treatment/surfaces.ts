// The six surfaces of a rectangular room, with openings (doors, windows) cut out of them.
import { checkBandValues, type BandValues } from './bands';

export type SurfaceId = 'floor' | 'ceiling' | 'front' | 'back' | 'left' | 'right';

export const SURFACE_IDS: readonly SurfaceId[] = ['floor', 'ceiling', 'front', 'back', 'left', 'right'];

export interface RoomDimensions {
	/** Length L (front to back), m. */
	lengthM: number;
	/** Width W (left to right), m. */
	widthM: number;
	/** Height H, m. */
	heightM: number;
}

export interface Opening {
	label: string;
	/** The surface the opening sits in. */
	surface: SurfaceId;
	widthM: number;
	heightM: number;
	/** Absorption of the opening's own finish per planning band (a door, a window pane). */
	coefficients: BandValues;
}

export interface SurfacePatch {
	/** Surface id for the remaining wall/floor/ceiling area, or the opening's label. */
	label: string;
	surface: SurfaceId;
	kind: 'surface' | 'opening';
	areaM2: number;
	coefficients: BandValues;
}

/** Sides of one surface: floor/ceiling L×W, front/back W×H, left/right L×H. */
export function surfaceSidesM(room: RoomDimensions, surface: SurfaceId): [number, number] {
	const { lengthM: L, widthM: W, heightM: H } = room;
	switch (surface) {
		case 'floor':
		case 'ceiling':
			return [L, W];
		case 'front':
		case 'back':
			return [W, H];
		case 'left':
		case 'right':
			return [L, H];
	}
}

/** Gross area of one surface. */
export function surfaceAreaM2(room: RoomDimensions, surface: SurfaceId): number {
	const [a, b] = surfaceSidesM(room, surface);
	return a * b;
}

export function checkRoom(room: RoomDimensions): void {
	for (const [key, v] of Object.entries(room)) {
		if (!(typeof v === 'number' && Number.isFinite(v) && v > 0)) {
			throw new Error(`room ${key} must be a positive number of metres, got ${String(v)}`);
		}
	}
}

export const roomVolumeM3 = (room: RoomDimensions): number => room.lengthM * room.widthM * room.heightM;

export const roomSurfaceAreaM2 = (room: RoomDimensions): number =>
	SURFACE_IDS.reduce((sum, s) => sum + surfaceAreaM2(room, s), 0);

/**
 * Splits the room into absorbing patches: each surface minus its openings, plus the openings
 * with their own finish. Throws when the openings on a surface exceed its area.
 */
export function roomPatches(
	room: RoomDimensions,
	finishes: Record<SurfaceId, BandValues>,
	openings: readonly Opening[] = []
): SurfacePatch[] {
	checkRoom(room);
	const patches: SurfacePatch[] = [];
	for (const surface of SURFACE_IDS) {
		const finish = finishes[surface];
		if (!finish) throw new Error(`no finish given for the ${surface} surface`);
		checkBandValues(finish, `finish of the ${surface} surface`);
		const gross = surfaceAreaM2(room, surface);
		const here = openings.filter((o) => o.surface === surface);
		let openArea = 0;
		for (const o of here) {
			if (!(o.widthM > 0 && o.heightM > 0)) {
				throw new Error(`opening "${o.label}" needs a positive width and height`);
			}
			checkBandValues(o.coefficients, `finish of opening "${o.label}"`);
			const [a, b] = surfaceSidesM(room, surface);
			if (o.widthM > a || o.heightM > b) {
				throw new Error(
					`opening "${o.label}" (${o.widthM} × ${o.heightM} m) does not fit the ${surface} surface (${a} × ${b} m)`
				);
			}
			openArea += o.widthM * o.heightM;
			patches.push({
				label: o.label,
				surface,
				kind: 'opening',
				areaM2: o.widthM * o.heightM,
				coefficients: o.coefficients
			});
		}
		if (openArea > gross) {
			throw new Error(
				`openings on the ${surface} surface total ${openArea.toFixed(2)} m², more than the surface's ${gross.toFixed(2)} m²`
			);
		}
		patches.push({ label: surface, surface, kind: 'surface', areaM2: gross - openArea, coefficients: finish });
	}
	return patches;
}
