import { describe, expect, it } from 'vitest';
import {
	expectedModeCount,
	roomModes,
	roomVolume,
	schroederFrequency,
	validateRoom,
	type RoomBox
} from '../../../src/lib/analysis/room';

const ROOM: RoomBox = { lengthM: 5, widthM: 4, heightM: 3 };

describe('roomModes of a 5 × 4 × 3 m room, c = 343 m/s', () => {
	const modes = roomModes(ROOM, 200);

	// Computed from Rayleigh's formula f = (c/2)·√((nx/L)² + (ny/W)² + (nz/H)²) (Kuttruff, Room
	// Acoustics, from memory), given to 0.01 Hz, hence 0.006 Hz tolerance.
	const lowest: { n: [number, number, number]; freqHz: number; kind: string }[] = [
		{ n: [1, 0, 0], freqHz: 34.3, kind: 'axial' },
		{ n: [0, 1, 0], freqHz: 42.88, kind: 'axial' },
		{ n: [1, 1, 0], freqHz: 54.91, kind: 'tangential' },
		{ n: [0, 0, 1], freqHz: 57.17, kind: 'axial' },
		{ n: [1, 0, 1], freqHz: 66.67, kind: 'tangential' },
		{ n: [2, 0, 0], freqHz: 68.6, kind: 'axial' },
		{ n: [0, 1, 1], freqHz: 71.46, kind: 'tangential' },
		{ n: [1, 1, 1], freqHz: 79.26, kind: 'oblique' },
		{ n: [2, 1, 0], freqHz: 80.9, kind: 'tangential' },
		{ n: [0, 2, 0], freqHz: 85.75, kind: 'axial' }
	];
	it.each(lowest.map((mode, rank) => ({ ...mode, rank })))('mode $rank: $n at $freqHz Hz ($kind)', ({ rank, n, freqHz, kind }) => {
		expect(modes[rank].n).toEqual(n);
		expect(Math.abs(modes[rank].freqHz - freqHz)).toBeLessThan(0.006);
		expect(modes[rank].kind).toBe(kind);
	});

	it('counts every index triple below 200 Hz, sorted by frequency', () => {
		// Independent count: all (nx, ny, nz) ≠ 0 with Rayleigh's f ≤ 200 Hz, enumerated here over a
		// generous index range. It gives 76 (a numpy enumeration agrees).
		let counted = 0;
		for (let nx = 0; nx < 30; nx++)
			for (let ny = 0; ny < 30; ny++)
				for (let nz = 0; nz < 30; nz++) {
					const f = (343 / 2) * Math.sqrt((nx / 5) ** 2 + (ny / 4) ** 2 + (nz / 3) ** 2);
					if ((nx || ny || nz) && f <= 200) counted++;
				}
		expect(counted).toBe(76);
		expect(modes).toHaveLength(counted);
		for (let i = 1; i < modes.length; i++) expect(modes[i].freqHz).toBeGreaterThanOrEqual(modes[i - 1].freqHz);
		expect(modes.every((mode) => mode.freqHz <= 200)).toBe(true);
	});

	it('classifies kinds by the number of non-zero indices', () => {
		for (const mode of modes) {
			const nonZero = mode.n.filter((index) => index > 0).length;
			expect(mode.kind).toBe(['axial', 'tangential', 'oblique'][nonZero - 1]);
		}
		// Axial modes below 200 Hz, from f = c·n/(2·dimension): ⌊200·2·d/343⌋ per dimension → 5 + 4 + 3.
		expect(modes.filter((mode) => mode.kind === 'axial')).toHaveLength(5 + 4 + 3);
	});

	it('scales with the speed of sound', () => {
		// f ∝ c (formula): the (1,0,0) mode at c = 331.3 m/s is 331.3/10 Hz.
		expect(Math.abs(roomModes(ROOM, 50, 331.3)[0].freqHz - 33.13)).toBeLessThan(1e-9);
	});
});

describe('schroederFrequency', () => {
	// f_s = 2000·√(T/V) (Schroeder & Kuttruff, JASA 34:76, 1962, from memory); values computed from it for
	// V = 60 m³ are given to 0.1 Hz, hence 0.06 Hz tolerance.
	it.each([
		{ t60S: 0.3, volumeM3: 60, expected: 141.4 },
		{ t60S: 0.5, volumeM3: 60, expected: 182.6 },
		{ t60S: 2, volumeM3: 2000, expected: 2000 * Math.sqrt(2 / 2000) } // from the formula
	])('T = $t60S s, V = $volumeM3 m³ → $expected Hz', ({ t60S, volumeM3, expected }) => {
		expect(Math.abs(schroederFrequency(t60S, volumeM3) - expected)).toBeLessThan(0.06);
	});

	it.each([
		{ t60S: 0, volumeM3: 60 },
		{ t60S: 0.5, volumeM3: -1 },
		{ t60S: Number.NaN, volumeM3: 60 }
	])('rejects T = $t60S, V = $volumeM3', ({ t60S, volumeM3 }) => {
		expect(() => schroederFrequency(t60S, volumeM3)).toThrow(/must be a finite number > 0/);
	});
});

describe('expectedModeCount', () => {
	// N(f) ≈ 4πVf³/(3c³) + πSf²/(4c²) + Lf/(8c), Kuttruff, Room Acoustics (from memory);
	// V = 60 m³, S = 94 m², L = 48 m evaluated by hand here. 1e-9 relative.
	it.each([{ freqHz: 100 }, { freqHz: 200 }, { freqHz: 1000 }])('5 × 4 × 3 m at $freqHz Hz', ({ freqHz }) => {
		const k = freqHz / 343;
		const expected = (4 * Math.PI * 60 * k ** 3) / 3 + (Math.PI * 94 * k ** 2) / 4 + (48 * k) / 8;
		expect(Math.abs(expectedModeCount(ROOM, freqHz) / expected - 1)).toBeLessThan(1e-9);
	});

	it('agrees with the enumerated count once many modes are involved', () => {
		// The formula is asymptotic: at 1 kHz (several thousand modes) the counted and the
		// expected numbers agree within 2 % (common practice, no source, for the tolerance).
		const counted = roomModes(ROOM, 1000).length;
		expect(Math.abs(counted / expectedModeCount(ROOM, 1000) - 1)).toBeLessThan(0.02);
	});
});

describe('validateRoom and roomVolume', () => {
	it('computes the volume', () => {
		expect(roomVolume(ROOM)).toBeCloseTo(60, 12);
	});

	it.each([
		{ name: 'zero length', room: { ...ROOM, lengthM: 0 }, message: /lengthM must be greater than 0/ },
		{ name: 'negative width', room: { ...ROOM, widthM: -4 }, message: /widthM must be greater than 0/ },
		{ name: 'NaN height', room: { ...ROOM, heightM: Number.NaN }, message: /heightM must be a finite number/ },
		{ name: 'infinite length', room: { ...ROOM, lengthM: Infinity }, message: /lengthM must be a finite number/ },
		{ name: 'millimetres typed as metres', room: { ...ROOM, lengthM: 5000 }, message: /exceeds 200 m/ },
		{ name: 'missing height', room: { lengthM: 5, widthM: 4 } as RoomBox, message: /heightM/ }
	])('rejects $name', ({ room, message }) => {
		expect(() => validateRoom(room)).toThrow(message);
		expect(() => roomModes(room, 100)).toThrow(message);
	});

	it('accepts a valid room and a 200 m hall', () => {
		expect(() => validateRoom(ROOM)).not.toThrow();
		expect(() => validateRoom({ lengthM: 200, widthM: 100, heightM: 30 })).not.toThrow();
	});

	it('refuses a mode list that would not fit in memory', () => {
		expect(() => roomModes({ lengthM: 200, widthM: 200, heightM: 200 }, 20000)).toThrow(/lower maxFreqHz/);
	});
});
