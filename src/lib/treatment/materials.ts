// Absorption coefficients of room finishes per octave band (125 Hz … 4 kHz).
import { PLANNING_BANDS_HZ, TABLE_BANDS_HZ, type TableBandValues } from './bands';

/** 'user entry' marks a material typed in by the user (validateCustomMaterial). */
export type MaterialConfidence = 'published' | 'from memory' | 'user entry';

export interface Material {
	id: string;
	name: string;
	/** Random-incidence absorption coefficients at 125, 250, 500, 1000, 2000, 4000 Hz. */
	coefficients: TableBandValues;
	/** Citation of where the numbers come from. */
	source: string;
	confidence: MaterialConfidence;
}

const VORLAENDER =
	'Vorländer, Auralization, Springer 2008, annex, as carried in pyroomacoustics materials.json';
const EVEREST = 'Everest & Pohlmann, Master Handbook of Acoustics, appendix (absorption coefficients)';
const GENERAL = 'general handbook values (Everest & Pohlmann; Long, Architectural Acoustics)';

function row(
	id: string,
	name: string,
	coefficients: TableBandValues,
	source: string,
	confidence: MaterialConfidence
): Material {
	return { id, name, coefficients, source, confidence };
}

/** Built-in materials. Published rows first; rows marked 'from memory' are planning values. */
export const MATERIALS: readonly Material[] = [
	// Published rows (Vorländer annex).
	row('hard-surface', 'Hard surface, average (brick, plaster, hard floor)', [0.02, 0.02, 0.03, 0.03, 0.04, 0.05], VORLAENDER, 'published'),
	row('brickwork-rendered', 'Rendered brickwork', [0.01, 0.02, 0.02, 0.03, 0.03, 0.04], VORLAENDER, 'published'),
	row('concrete-smooth', 'Smooth unpainted concrete', [0.01, 0.01, 0.02, 0.02, 0.02, 0.05], VORLAENDER, 'published'),
	row('concrete-floor', 'Concrete floor', [0.01, 0.03, 0.05, 0.02, 0.02, 0.02], VORLAENDER, 'published'),
	row('ceramic-tiles', 'Ceramic tiles, smooth', [0.01, 0.01, 0.01, 0.02, 0.02, 0.02], VORLAENDER, 'published'),
	row('plasterboard', 'Plasterboard 2 × 13 mm on steel studs, 50 mm mineral wool, painted', [0.15, 0.1, 0.06, 0.04, 0.04, 0.05], VORLAENDER, 'published'),
	row('wooden-lining-12mm', 'Wooden lining 12 mm on frame', [0.27, 0.23, 0.22, 0.15, 0.1, 0.07], VORLAENDER, 'published'),
	row('glass-window', 'Glass window, 0.68 kg/m²', [0.1, 0.05, 0.04, 0.03, 0.03, 0.03], VORLAENDER, 'published'),
	row('glass-3mm', 'Single glass pane, 3 mm', [0.08, 0.04, 0.03, 0.03, 0.02, 0.02], VORLAENDER, 'published'),
	row('wood-16mm', '16 mm wood on 40 mm studs', [0.18, 0.12, 0.1, 0.09, 0.08, 0.07], VORLAENDER, 'published'),
	row('wooden-door', 'Solid wooden door', [0.14, 0.1, 0.06, 0.08, 0.1, 0.1], VORLAENDER, 'published'),
	row('linoleum', 'Linoleum, rubber or cork tile on concrete', [0.02, 0.03, 0.03, 0.03, 0.03, 0.02], VORLAENDER, 'published'),
	row('rockwool-50mm-80', 'Rock wool 50 mm, 80 kg/m³', [0.22, 0.6, 0.92, 0.9, 0.88, 0.88], VORLAENDER, 'published'),
	row('curtains-cotton', 'Cotton curtains 0.5 kg/m², gathered to 3/4 area, 130 mm from wall', [0.3, 0.45, 0.65, 0.56, 0.59, 0.71], VORLAENDER, 'published'),
	row('curtains-velvet', 'Tight velvet curtains', [0.05, 0.12, 0.35, 0.45, 0.38, 0.36], VORLAENDER, 'published'),
	row('carpet-cotton', 'Cotton carpet', [0.07, 0.31, 0.49, 0.81, 0.66, 0.54], VORLAENDER, 'published'),
	row('seats-heavy-upholstered', 'Heavily upholstered seats, unoccupied (per m² of seating)', [0.7, 0.76, 0.81, 0.84, 0.84, 0.81], VORLAENDER, 'published'),
	row('ceiling-fissured-tile', 'Fissured ceiling tile', [0.49, 0.53, 0.53, 0.75, 0.92, 0.99], VORLAENDER, 'published'),
	// Planning values recalled from handbooks; check against a datasheet before relying on them.
	row('concrete-painted', 'Painted concrete block or concrete', [0.1, 0.05, 0.06, 0.07, 0.09, 0.08], EVEREST, 'from memory'),
	row('brick-unglazed', 'Unglazed brick', [0.03, 0.03, 0.03, 0.04, 0.05, 0.07], EVEREST, 'from memory'),
	row('plasterboard-on-studs', 'Plasterboard 13 mm on studs, empty cavity', [0.29, 0.1, 0.05, 0.04, 0.07, 0.09], EVEREST, 'from memory'),
	row('wood-floor-on-joists', 'Wooden floor on joists', [0.15, 0.11, 0.1, 0.07, 0.06, 0.07], EVEREST, 'from memory'),
	row('carpet-on-concrete', 'Heavy carpet on concrete', [0.02, 0.06, 0.14, 0.37, 0.6, 0.65], EVEREST, 'from memory'),
	row('carpet-on-underlay', 'Heavy carpet on foam underlay', [0.08, 0.24, 0.57, 0.69, 0.71, 0.73], EVEREST, 'from memory'),
	row('curtains-heavy', 'Heavy velour curtains, draped to half area', [0.14, 0.35, 0.55, 0.72, 0.7, 0.65], EVEREST, 'from memory'),
	row('glass-heavy-plate', 'Heavy plate glass', [0.18, 0.06, 0.04, 0.03, 0.02, 0.02], EVEREST, 'from memory'),
	row('plaster-on-masonry', 'Plaster on brick or block', [0.01, 0.02, 0.02, 0.03, 0.04, 0.05], GENERAL, 'from memory'),
	row('upholstered-sofa', 'Upholstered sofa or armchairs (per m² of footprint)', [0.4, 0.5, 0.58, 0.61, 0.58, 0.5], GENERAL, 'from memory'),
	row('bookshelf-filled', 'Filled bookshelf', [0.3, 0.4, 0.4, 0.3, 0.3, 0.2], GENERAL, 'from memory')
];

/** Looks a built-in material up by id; throws with the known ids when it is missing. */
export function materialById(id: string, materials: readonly Material[] = MATERIALS): Material {
	const found = materials.find((m) => m.id === id);
	if (!found) {
		throw new Error(`unknown material "${id}"; known: ${materials.map((m) => m.id).join(', ')}`);
	}
	return found;
}

/**
 * Coefficients on the planning bands (63 Hz … 8 kHz). Tables stop at 125 Hz and 4 kHz, so the
 * 63 Hz band takes the 125 Hz value and 8 kHz the 4 kHz value (nearest published band).
 */
export function materialBandCoefficients(material: Pick<Material, 'coefficients'>): number[] {
	const c = material.coefficients;
	return PLANNING_BANDS_HZ.map((f) => {
		const i = TABLE_BANDS_HZ.indexOf(f as (typeof TABLE_BANDS_HZ)[number]);
		if (i >= 0) return c[i];
		return f < TABLE_BANDS_HZ[0] ? c[0] : c[c.length - 1];
	});
}

/** Bands whose value is borrowed from the nearest published band. */
export const BORROWED_BANDS_HZ: readonly number[] = PLANNING_BANDS_HZ.filter(
	(f) => !(TABLE_BANDS_HZ as readonly number[]).includes(f)
);

export interface CustomMaterialInput {
	id?: unknown;
	name?: unknown;
	coefficients?: unknown;
	source?: unknown;
}

export type CustomMaterialResult =
	| { ok: true; material: Material }
	| { ok: false; errors: string[] };

/**
 * Checks a material a user typed in. Coefficients must lie in [0, 1]: a measured value above 1
 * is an artefact of the reverberation-room method (edge diffraction), not energy; a planning
 * model must not create energy, so it is refused rather than silently clipped.
 */
export function validateCustomMaterial(input: CustomMaterialInput): CustomMaterialResult {
	const errors: string[] = [];
	const id = typeof input.id === 'string' ? input.id.trim() : '';
	const name = typeof input.name === 'string' ? input.name.trim() : '';
	if (!/^[a-z0-9][a-z0-9-]{0,63}$/.test(id)) {
		errors.push('id: use 1–64 lower-case letters, digits or dashes, starting with a letter or digit');
	}
	if (name.length === 0 || name.length > 120) errors.push('name: give a name of 1–120 characters');
	const raw = input.coefficients;
	if (!Array.isArray(raw) || raw.length !== TABLE_BANDS_HZ.length) {
		errors.push(`coefficients: give ${TABLE_BANDS_HZ.length} values, for ${TABLE_BANDS_HZ.join(', ')} Hz`);
	} else {
		raw.forEach((v, i) => {
			if (typeof v !== 'number' || !Number.isFinite(v)) {
				errors.push(`coefficients: the value at ${TABLE_BANDS_HZ[i]} Hz is not a number`);
			} else if (v < 0 || v > 1) {
				errors.push(`coefficients: the value at ${TABLE_BANDS_HZ[i]} Hz (${v}) must lie between 0 and 1`);
			}
		});
	}
	if (errors.length > 0) return { ok: false, errors };
	const source = typeof input.source === 'string' && input.source.trim() ? input.source.trim() : 'user entry';
	return {
		ok: true,
		material: {
			id,
			name,
			coefficients: [...(raw as number[])] as unknown as TableBandValues,
			source,
			confidence: 'user entry'
		}
	};
}
