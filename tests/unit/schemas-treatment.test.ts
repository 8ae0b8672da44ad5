import { describe, expect, it } from 'vitest';
import {
	coefficientsOf,
	customMaterialKey,
	customMaterialSchema,
	diffuserParamsSchema,
	itemFormSchema,
	lengthField,
	LIMITS,
	openingFormSchema,
	parseMaterialKey,
	planSettingsSchema,
	stockFormSchema,
	unitOfSystem
} from '../../src/lib/schemas/treatment';

const MM_PER_IN = 25.4; // exact, international inch (1959)
const messages = (r: { success: boolean; error?: { issues: { message: string }[] } }) => (r.success ? [] : r.error!.issues.map((i) => i.message));

describe('length fields', () => {
	const metric = lengthField('width', 'mm', LIMITS.unitSideMm);
	const imperial = lengthField('width', 'in', LIMITS.unitSideMm);

	it.each([
		['600', 600],
		['600 mm', 600],
		['600mm', 600],
		['60 cm', 600],
		['0.6 m', 600],
		[' 600 ', 600],
		['595,5', 595.5], // decimal comma
		['23 5/8 in', 23.625 * MM_PER_IN], // = 600.075 mm
		['23-5/8″', 23.625 * MM_PER_IN],
		['24 in', 24 * MM_PER_IN]
	])('metric user: "%s" → %f mm (25.4 mm/in exact; 1e-9 for float)', (text, mm) => {
		const r = metric.safeParse(text);
		expect(r.success).toBe(true);
		expect(Math.abs((r.data as number) - mm)).toBeLessThan(1e-9);
	});

	it.each([
		['24', 24 * MM_PER_IN], // a bare number is inches for an imperial user
		['23 5/8', 23.625 * MM_PER_IN],
		['600 mm', 600],
		['60 cm', 600]
	])('imperial user: "%s" → %f mm', (text, mm) => {
		const r = imperial.safeParse(text);
		expect(r.success).toBe(true);
		expect(Math.abs((r.data as number) - mm)).toBeLessThan(1e-9);
	});

	it.each([
		['abc', /^Width: "abc" is not a length/],
		['-5', /^Width: "-5": a length cannot be negative/],
		['', /^Enter the width\.$/],
		['5 3/4 cm', /fractions are for inches/]
	])('refuses "%s" with one message', (text, message) => {
		const m = messages(metric.safeParse(text));
		expect(m).toHaveLength(1);
		expect(m[0]).toMatch(message);
	});

	it('out of range: the message names both limits in the user’s unit', () => {
		expect(messages(metric.safeParse('50'))).toEqual(['The width must lie between 100 mm and 3000 mm.']);
		expect(messages(metric.safeParse('3001'))).toEqual(['The width must lie between 100 mm and 3000 mm.']);
		// 100 mm = 3.937 in → 3 15/16″; 3000 mm = 118.11 in → 118 1/8″ (nearest 1/16).
		expect(messages(imperial.safeParse('2'))).toEqual(['The width must lie between 3 15/16″ and 118 1/8″.']);
	});

	it('accepts the limits themselves', () => {
		expect(metric.safeParse('100').success).toBe(true);
		expect(metric.safeParse('3000 mm').success).toBe(true);
	});

	it('unit of a measuring system', () => {
		expect(unitOfSystem('metric')).toBe('mm');
		expect(unitOfSystem('imperial')).toBe('in');
	});
});

describe('item form', () => {
	const common = { label: 'Rear diffuser', quantity: '1', heightMm: '1200', surface: 'back' };
	const diffuser = { ...common, kind: 'diffuser', sequence: 'quadratic-residue', prime: '7', designFrequencyHz: '500', wellWidthMm: '50', finThicknessMm: '6', boardThicknessMm: '18' };
	const porous = { ...common, kind: 'porous', surface: 'left', widthMm: '600', thicknessMm: '100', preset: 'rock-wool-40', frameThicknessMm: '18' };

	it('a diffuser: numbers in mm, width 0 (the design fixes it), no depth limit when empty', () => {
		const r = itemFormSchema('mm').parse(diffuser);
		expect(r.widthMm).toBe(0);
		expect(r.params).toEqual({ kind: 'diffuser', sequence: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthMm: 50, finThicknessMm: 6, maxDepthMm: null, boardThicknessMm: 18, construction: 'full-depth', mounting: { method: 'none', notes: '' }, fit: null });
		expect(r.surface).toBe('back');
		expect(r.unitPrice).toBeNull();
		expect(r.why).toBeNull();
	});

	it.each(['9', '15', '1'])('refuses a non-prime number of wells: %s', (prime) => {
		const m = messages(itemFormSchema('mm').safeParse({ ...diffuser, prime }));
		expect(m.some((x) => /must be a prime/.test(x))).toBe(true);
	});

	it.each(['5', '7', '11', '13', '53'])('accepts a prime number of wells: %s', (prime) => {
		expect(itemFormSchema('mm').safeParse({ ...diffuser, prime }).success).toBe(true);
	});

	it('a depth limit typed in inches by an imperial user', () => {
		const r = itemFormSchema('in').parse({ ...diffuser, heightMm: '47 1/4', wellWidthMm: '2', finThicknessMm: '1/4', boardThicknessMm: '3/4', maxDepthMm: '6' });
		if (r.params.kind !== 'diffuser') throw new Error('expected a diffuser');
		expect(r.heightMm).toBeCloseTo(47.25 * MM_PER_IN, 9);
		expect(r.params.wellWidthMm).toBeCloseTo(50.8, 9);
		expect(r.params.finThicknessMm).toBeCloseTo(6.35, 9);
		expect(r.params.maxDepthMm).toBeCloseTo(152.4, 9);
	});

	it('porous: the preset gives σ; a typed σ wins and drops the preset; an empty gap is 0', () => {
		const preset = itemFormSchema('mm').parse(porous);
		if (preset.params.kind !== 'porous') throw new Error('expected porous');
		expect(preset.params.flowResistivity).toBe(15_000);
		expect(preset.params.presetId).toBe('rock-wool-40');
		expect(preset.params.airGapMm).toBe(0);
		expect(preset.params.fabricWrapped).toBe(false);
		const typed = itemFormSchema('mm').parse({ ...porous, flowResistivityKPa: '20', fabricWrapped: 'on' });
		if (typed.params.kind !== 'porous') throw new Error('expected porous');
		expect(typed.params.flowResistivity).toBe(20_000);
		expect(typed.params.presetId).toBeNull();
		expect(typed.params.fabricWrapped).toBe(true);
	});

	it('porous: σ outside 1…200 kPa·s/m² and an unknown preset are refused', () => {
		expect(messages(itemFormSchema('mm').safeParse({ ...porous, flowResistivityKPa: '500' }))).toContain('Flow resistivity between 1 and 200 kPa·s/m².');
		expect(messages(itemFormSchema('mm').safeParse({ ...porous, preset: 'cotton' }))).toContain('Pick a fibre from the list, or give its flow resistivity.');
	});

	it('quantity is a whole number from 1 to 200; a surface must be known', () => {
		expect(messages(itemFormSchema('mm').safeParse({ ...porous, quantity: '2.5' }))).toContain('The quantity is a whole number.');
		expect(messages(itemFormSchema('mm').safeParse({ ...porous, quantity: '0' }))).toContain('The quantity must lie between 1 and 200.');
		expect(messages(itemFormSchema('mm').safeParse({ ...porous, surface: 'window' }))).toContain('Pick a surface, or free-standing.');
		expect(itemFormSchema('mm').parse({ ...porous, surface: '' }).surface).toBeNull();
	});

	it('an unknown kind is refused', () => {
		expect(messages(itemFormSchema('mm').safeParse({ ...porous, kind: 'helmholtz' }))).toEqual(['Pick what kind of treatment this is.']);
	});

	it('membrane: the cavity must lie within its limits, in the user’s unit', () => {
		const membrane = { ...common, kind: 'membrane', widthMm: '600', panelThicknessMm: '6', panelStockId: 'plywood', cavityDepthMm: '10', cavityFill: 'porous', frameThicknessMm: '18' };
		expect(messages(itemFormSchema('mm').safeParse(membrane))).toEqual(['The cavity depth must lie between 20 mm and 500 mm.']);
		expect(itemFormSchema('mm').parse({ ...membrane, cavityDepthMm: '27.6 cm' }).params).toMatchObject({ cavityDepthMm: 276 });
	});

	it('stored diffuser parameters refuse a non-prime number of wells too', () => {
		const ok = { kind: 'diffuser', sequence: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthMm: 50, finThicknessMm: 6, maxDepthMm: null, boardThicknessMm: 18 };
		expect(diffuserParamsSchema.safeParse(ok).success).toBe(true);
		// A row stored before constructions existed reads as the full-depth box it was built as.
		expect(diffuserParamsSchema.parse(ok).construction).toBe('full-depth');
		expect(diffuserParamsSchema.parse({ ...ok, construction: 'low-waste' }).construction).toBe('low-waste');
		expect(diffuserParamsSchema.safeParse({ ...ok, construction: 'solid' }).success).toBe(false);
		// … and as not fixed and not fitted into an opening.
		expect(diffuserParamsSchema.parse(ok)).toMatchObject({ mounting: { method: 'none', notes: '' }, fit: null });
		expect(messages(diffuserParamsSchema.safeParse({ ...ok, prime: 9 }))).toEqual(['The number of wells must be a prime.']);
	});

	it('mounting and the fit into an opening: all four sides or none, in the form\'s unit', () => {
		const withFit = { ...diffuser, mountingMethod: 'french-cleat', mountingNotes: '4 × 5 × 60 screws', fitWidthTopMm: '1000', fitWidthBottomMm: '1010', fitHeightLeftMm: '1500', fitHeightRightMm: '1490' };
		expect(itemFormSchema('mm').parse(withFit).params).toMatchObject({
			mounting: { method: 'french-cleat', notes: '4 × 5 × 60 screws' },
			fit: { widthTopMm: 1000, widthBottomMm: 1010, heightLeftMm: 1500, heightRightMm: 1490, diagonalMm: null, clearanceMm: 3 }
		});
		// In inches: 39 3/8 in = 1000.125 mm (1 in = 25.4 mm exactly).
		expect(itemFormSchema('in').parse({ ...withFit, heightMm: '47 1/4', wellWidthMm: '2', finThicknessMm: '1/4', boardThicknessMm: '3/4', fitWidthTopMm: '39 3/8', fitWidthBottomMm: '39 3/4', fitHeightLeftMm: '59', fitHeightRightMm: '58 5/8', fitClearanceMm: '1/8' }).params.fit).toEqual({
			widthTopMm: expect.closeTo(1000.125, 9),
			widthBottomMm: expect.closeTo(1009.65, 9),
			heightLeftMm: expect.closeTo(1498.6, 9),
			heightRightMm: expect.closeTo(1489.075, 9),
			diagonalMm: null,
			clearanceMm: expect.closeTo(3.175, 9)
		});
		const partial = itemFormSchema('mm').safeParse({ ...withFit, fitHeightRightMm: '' });
		expect(messages(partial)).toEqual(['Give all four sides of the opening (widths at top and bottom, heights at left and right), or none.']);
		expect(itemFormSchema('mm').safeParse({ ...withFit, mountingMethod: 'nails' }).success).toBe(false);
	});
});

describe('opening form: a bare number is metres for metric users, inches for imperial', () => {
	const door = { label: 'Door', surface: 'front', widthM: '0.9', heightM: '2', materialKey: 'wooden-door' };

	it('metric: "0.9" and "2" are metres; "90 cm" too', () => {
		const r = openingFormSchema('mm').parse(door);
		expect(r.widthM).toBeCloseTo(0.9, 12);
		expect(r.heightM).toBeCloseTo(2, 12);
		expect(openingFormSchema('mm').parse({ ...door, widthM: '90 cm' }).widthM).toBeCloseTo(0.9, 12);
	});

	it('imperial: "36" and "80" are inches (0.9144 m and 2.032 m)', () => {
		const r = openingFormSchema('in').parse({ ...door, widthM: '36', heightM: '80' });
		expect(r.widthM).toBeCloseTo(36 * 0.0254, 12);
		expect(r.heightM).toBeCloseTo(80 * 0.0254, 12);
	});

	it('imperial: "2" inches is too small for an opening (below 0.1 m)', () => {
		expect(openingFormSchema('in').safeParse(door).success).toBe(false);
	});

	it('needs a surface of the room', () => {
		expect(messages(openingFormSchema('mm').safeParse({ ...door, surface: 'roof' }))).toEqual(['Pick the surface it is in.']);
	});
});

describe('custom material', () => {
	const material = { name: 'Acoustic plaster', source: 'manufacturer datasheet', a125: '0.1', a250: '0.2', a500: '0.5', a1000: '0.7', a2000: '0.8', a4000: '0.8' };

	it('reads six coefficients in band order 125 … 4k', () => {
		expect(coefficientsOf(customMaterialSchema.parse(material))).toEqual([0.1, 0.2, 0.5, 0.7, 0.8, 0.8]);
	});

	it.each([
		['1.2', 'a1000'],
		['-0.1', 'a1000']
	])('refuses %s with a message about 0…1', (value, key) => {
		const r = customMaterialSchema.safeParse({ ...material, [key]: value });
		expect(messages(r)).toEqual(['The coefficient at 1000 Hz must lie between 0 and 1 (values above 1 are a measurement artefact).']);
	});

	it('accepts 0 and 1 themselves', () => {
		expect(customMaterialSchema.safeParse({ ...material, a125: '0', a4000: '1' }).success).toBe(true);
	});

	it('asks where the numbers come from', () => {
		expect(messages(customMaterialSchema.safeParse({ ...material, source: '' }))).toEqual(['Say where the coefficients come from (datasheet, handbook, measurement).']);
	});
});

describe('stock sheet form', () => {
	const sheet = { label: 'Birch ply 18', lengthMm: '2440', widthMm: '1220', thicknessMm: '18', finishedFaces: '1', grain: 'along-length', price: '96' };

	it.each([
		['0', 0],
		['1', 1],
		['2', 2]
	])('faces "%s" → %i', (faces, n) => {
		expect(stockFormSchema('mm').parse({ ...sheet, finishedFaces: faces }).finishedFaces).toBe(n);
	});

	it.each(['3', '-1', '1.5'])('faces "%s" refused', (faces) => {
		expect(messages(stockFormSchema('mm').safeParse({ ...sheet, finishedFaces: faces }))).toEqual(['Say how many faces are good: 0, 1 or 2.']);
	});

	it('faces that are not a number refused', () => {
		expect(stockFormSchema('mm').safeParse({ ...sheet, finishedFaces: 'both' }).success).toBe(false);
	});

	it('a 4 × 8 ft sheet typed in inches: 96 × 48 in = 2438.4 × 1219.2 mm', () => {
		const r = stockFormSchema('in').parse({ ...sheet, lengthMm: '96', widthMm: '48', thicknessMm: '3/4' });
		expect(r.lengthMm).toBeCloseTo(2438.4, 9);
		expect(r.widthMm).toBeCloseTo(1219.2, 9);
		expect(r.thicknessMm).toBeCloseTo(19.05, 9);
	});

	it('an empty price is no price; a negative one is refused', () => {
		expect(stockFormSchema('mm').parse({ ...sheet, price: '' }).price).toBeNull();
		expect(messages(stockFormSchema('mm').safeParse({ ...sheet, price: '-3' }))).toEqual(['A price of 0 or more, or leave it empty.']);
	});
});

describe('plan settings', () => {
	const settings = { temperatureC: '21', relativeHumidityPct: '45', kerfMm: '3.2', currency: 'EUR', notes: ' French cleats ', includeInReport: 'on' };

	it('reads the numbers, trims the notes, an empty kerf is 0', () => {
		const r = planSettingsSchema('mm').parse(settings);
		expect(r).toMatchObject({ temperatureC: 21, relativeHumidityPct: 45, kerfMm: 3.2, currency: 'EUR', notes: 'French cleats', includeInReport: true, baselineSessionId: null });
		expect(planSettingsSchema('mm').parse({ ...settings, kerfMm: '' }).kerfMm).toBe(0);
	});

	it.each([
		['eur', 'EUR'],
		[' usd ', 'USD'],
		['Gbp', 'GBP']
	])('currency "%s" → %s', (text, code) => {
		expect(planSettingsSchema('mm').parse({ ...settings, currency: text }).currency).toBe(code);
	});

	it.each(['EURO', 'E1R', '€', '', 'EU'])('currency "%s" refused: three letters', (text) => {
		expect(messages(planSettingsSchema('mm').safeParse({ ...settings, currency: text }))).toEqual(['A three-letter currency code, e.g. EUR or USD.']);
	});

	it('temperature −20…50 °C and humidity 10…100 % (the range of ISO 9613-1 the air model covers)', () => {
		expect(messages(planSettingsSchema('mm').safeParse({ ...settings, temperatureC: '60' }))).toEqual(['The temperature must lie between -20 and 50 °C.']);
		expect(messages(planSettingsSchema('mm').safeParse({ ...settings, relativeHumidityPct: '5' }))).toEqual(['The relative humidity must lie between 10 and 100 %.']);
	});

	it('a kerf above 10 mm is refused', () => {
		expect(messages(planSettingsSchema('mm').safeParse({ ...settings, kerfMm: '12' }))).toEqual(['The saw kerf must lie between 0 mm and 10 mm.']);
	});
});

describe('material keys', () => {
	it.each([
		['hard-surface', { builtin: 'hard-surface' }],
		['glass-window', { builtin: 'glass-window' }],
		['custom-12', { customId: 12 }],
		[customMaterialKey(345), { customId: 345 }],
		['custom-', null],
		['custom-abc', null],
		['custom-12345678901', null], // more than ten digits
		['custom-12x', null],
		['marble', null],
		['', null]
	])('"%s" → %o', (key, parsed) => {
		expect(parseMaterialKey(key)).toEqual(parsed);
	});
});

describe('an empty number field asks for the number instead of reading 0', () => {
	// z.coerce.number() turns "" into 0 (Number("") === 0), so the "Enter the …" messages never show:
	// a coefficient left blank becomes α = 0 and a cleared temperature becomes 0 °C, silently.
	it('a blank absorption coefficient is refused', () => {
		const material = { name: 'Acoustic plaster', source: 'manufacturer datasheet', a125: '0.1', a250: '0.2', a500: '0.5', a1000: '0.7', a2000: '', a4000: '0.8' };
		expect(messages(customMaterialSchema.safeParse(material))).toEqual(['Enter the coefficient at 2000 Hz.']);
	});

	it('a blank temperature is refused', () => {
		const settings = { temperatureC: '', relativeHumidityPct: '45', kerfMm: '3', currency: 'EUR' };
		expect(messages(planSettingsSchema('mm').safeParse(settings))).toEqual(['Enter the temperature.']);
	});
});

describe('inch lengths written at a limit are taken as the limit (inputs to 1/32″, messages to 1/16″)', () => {
	// The message rounds the limit to 1/16 in: 3000 mm is shown as 118 1/8″ = 3000.175 mm, and
	// typing exactly that is refused. The check should allow what the display rounds to.
	it('"118 1/8" is accepted for a width whose stated maximum is 118 1/8″', () => {
		const imperial = lengthField('width', 'in', LIMITS.unitSideMm);
		expect(messages(imperial.safeParse('2'))[0]).toContain('118 1/8″');
		expect(imperial.safeParse('118 1/8').success).toBe(true);
	});
});
