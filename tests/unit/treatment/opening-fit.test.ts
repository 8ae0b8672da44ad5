import { describe, expect, it } from 'vitest';
import { circleIntersections, fitOpening, openingCorners, openingFitSvg, TRIM_LAP_MM } from '../../../src/lib/treatment/opening-fit';

// A recess drawn by hand: corners BL (0, 0), BR (1000, 0), TR (980, 1510), TL (0, 1500) mm —
// bottom level, left side plumb, right side leaning in 20 mm over its height, top rising 10 mm.
// Its measurements follow by Pythagoras: top √(980² + 10²), right √(20² + 1510²).
const TOP = Math.hypot(980, 10); // 980.051 mm
const RIGHT = Math.hypot(20, 1510); // 1510.132 mm
const RECESS = { widthTopMm: TOP, widthBottomMm: 1000, heightLeftMm: 1500, heightRightMm: RIGHT, diagonalMm: null, clearanceMm: 3 };

describe('out-of-square opening', () => {
	it('recovers the corners from the four sides (bottom level, left plumb)', () => {
		const c = openingCorners(RECESS);
		expect(c['top right'].x).toBeCloseTo(980, 6);
		expect(c['top right'].y).toBeCloseTo(1510, 6);
		expect(c['top left']).toEqual({ x: 0, y: 1500 });
	});

	it('and from three sides and the diagonal BL–TR = √(980² + 1510²), without assuming the left plumb', () => {
		const c = openingCorners({ ...RECESS, diagonalMm: Math.hypot(980, 1510) });
		expect(c['top right'].x).toBeCloseTo(980, 6);
		expect(c['top right'].y).toBeCloseTo(1510, 6);
		expect(c['top left'].x).toBeCloseTo(0, 6);
		expect(c['top left'].y).toBeCloseTo(1500, 6);
	});

	it('the largest level panel with 3 mm all round, by hand', () => {
		// Hand: the left side is x = 0; the right side x = 1000 − 20·y/1510; the top y = 1500 + 10·x/980.
		// The panel stands on y = 3 from x = 3; its top is limited at its left end: y = 1500 + 30/980 − 3,
		// so H = 1494 + 30/980 = 1494.0306 mm; its right end by the right side at the panel's top:
		// W = 1000 − 20·(3 + H)/1510 − 3 − 3 = 974.1718 mm.
		const fit = fitOpening(RECESS);
		const H = 1494 + 30 / 980;
		const W = 994 - (20 * (3 + H)) / 1510;
		expect(fit.largest.heightMm).toBeCloseTo(H, 6);
		expect(fit.largest.widthMm).toBeCloseTo(W, 6);
		expect(fit.largest).toMatchObject({ x: 3, y: 3 });
		expect(fit.fits).toBe(true);
	});

	it('a 900 × 1400 mm unit against the left: shims 3 mm at the left, 96.96 and 78.42 mm at the right', () => {
		const fit = fitOpening(RECESS, { widthMm: 900, heightMm: 1400 });
		const shim = Object.fromEntries(fit.shims.map((s) => [s.corner, s.thicknessMm]));
		// Hand: the unit spans x 3 … 903, y 3 … 1403. Right side at y = 3: 1000 − 20·3/1510 = 999.9603;
		// at y = 1403: 1000 − 20·1403/1510 = 981.4172; minus the unit's right side at 903.
		expect(shim['bottom left']).toBeCloseTo(3, 9);
		expect(shim['top left']).toBeCloseTo(3, 9);
		expect(shim['bottom right']).toBeCloseTo(1000 - (20 * 3) / 1510 - 903, 6); // 96.9603
		expect(shim['top right']).toBeCloseTo(1000 - (20 * 1403) / 1510 - 903, 6); // 78.4172
		// Trims lap 10 mm over the unit and 10 mm over the wall beyond the largest gap on each side.
		const trim = Object.fromEntries(fit.trims.map((t) => [t.side, t]));
		expect(TRIM_LAP_MM).toBe(10);
		expect(trim.right.widthMm).toBe(Math.ceil(96.9603 + 20));
		expect(trim.left.widthMm).toBe(23);
		// Top gap: the top at x = 903 is 1500 + 10·903/980 = 1509.2143; minus 1403 = 106.2143.
		expect(trim.top.gapMm).toBeCloseTo(1500 + (10 * 903) / 980 - 1403, 6);
		expect(trim.top.lengthMm).toBe(900 + 23 + 117);
		expect(trim.left.lengthMm).toBe(1400);
	});

	it('says when the unit is larger than the opening allows', () => {
		expect(fitOpening(RECESS, { widthMm: 980, heightMm: 1400 }).fits).toBe(false);
		expect(fitOpening(RECESS, { widthMm: 900, heightMm: 1495 }).fits).toBe(false);
	});

	it('refuses measurements that do not close, and a clearance that leaves no room', () => {
		expect(() => openingCorners({ ...RECESS, widthTopMm: 100 })).toThrow(/do not close/);
		expect(() => fitOpening({ ...RECESS, clearanceMm: -1 })).toThrow(/clearance/);
		expect(circleIntersections({ x: 0, y: 0 }, 1, { x: 5, y: 0 }, 1)).toBeNull();
	});

	it('draws the recess, the unit and a shim at each corner with its thickness', () => {
		const svg = openingFitSvg(fitOpening(RECESS, { widthMm: 900, heightMm: 1400 }), { unit: 'mm' });
		expect(svg).toContain('<polygon');
		expect(svg).toContain('unit 900 mm × 1400 mm');
		expect(svg).toContain('>97 mm<');
		expect(svg).toContain('>78 mm<');
	});
});
