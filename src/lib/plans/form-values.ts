// An item as the fields of its form (the inverse of the form schema), and the starting values
// of a new item of each kind.
import type { LengthUnit } from '../treatment/units';
import { lengthInput } from './format';
import type { ItemDraft } from './proposals';
import type { ItemKind } from './types';

export type FormValues = Record<string, string>;

export function itemFormValues(item: ItemDraft, unit: LengthUnit): FormValues {
	const len = (mm: number) => lengthInput(mm, unit);
	const common: FormValues = {
		kind: item.params.kind,
		label: item.label,
		surface: item.surface ?? '',
		quantity: String(item.quantity),
		widthMm: len(item.widthMm),
		heightMm: len(item.heightMm),
		unitPrice: item.unitPrice === null ? '' : String(item.unitPrice),
		problemBandId: item.problemBandId === null ? '' : String(item.problemBandId),
		why: item.why ?? '',
		mountingMethod: item.params.mounting?.method ?? 'none',
		mountingNotes: item.params.mounting?.notes ?? '',
		fitWidthTopMm: item.params.fit ? len(item.params.fit.widthTopMm) : '',
		fitWidthBottomMm: item.params.fit ? len(item.params.fit.widthBottomMm) : '',
		fitHeightLeftMm: item.params.fit ? len(item.params.fit.heightLeftMm) : '',
		fitHeightRightMm: item.params.fit ? len(item.params.fit.heightRightMm) : '',
		fitDiagonalMm: item.params.fit?.diagonalMm ? len(item.params.fit.diagonalMm) : '',
		fitClearanceMm: item.params.fit ? len(item.params.fit.clearanceMm) : ''
	};
	const p = item.params;
	switch (p.kind) {
		case 'porous':
			return {
				...common,
				thicknessMm: len(p.thicknessMm),
				airGapMm: len(p.airGapMm),
				preset: p.presetId ?? '',
				model: p.model ?? 'miki',
				flowResistivityKPa: p.presetId ? '' : String(p.flowResistivity / 1000),
				frameThicknessMm: len(p.frameThicknessMm),
				fabricWrapped: p.fabricWrapped ? 'on' : '',
				withBack: p.withBack ? 'on' : ''
			};
		case 'membrane':
			return {
				...common,
				panelThicknessMm: len(p.panelThicknessMm),
				panelStockId: p.panelStockId,
				cavityDepthMm: len(p.cavityDepthMm),
				cavityFill: p.cavityFill,
				frameThicknessMm: len(p.frameThicknessMm)
			};
		case 'diffuser':
			return {
				...common,
				sequence: p.sequence,
				prime: String(p.prime),
				designFrequencyHz: String(p.designFrequencyHz),
				wellWidthMm: len(p.wellWidthMm),
				finThicknessMm: len(p.finThicknessMm),
				maxDepthMm: p.maxDepthMm === null ? '' : len(p.maxDepthMm),
				boardThicknessMm: len(p.boardThicknessMm),
				construction: p.construction ?? 'full-depth'
			};
	}
}

/** A new item of each kind starts from common workshop sizes (common practice, no source). */
export const NEW_ITEM: Record<ItemKind, ItemDraft> = {
	porous: {
		label: 'Side-wall absorber',
		surface: 'left',
		quantity: 2,
		widthMm: 600,
		heightMm: 1200,
		unitPrice: null,
		problemBandId: null,
		why: null,
		params: { kind: 'porous', thicknessMm: 100, airGapMm: 0, flowResistivity: 15_000, presetId: 'rock-wool-40', model: 'miki', frameThicknessMm: 18, fabricWrapped: true, withBack: false, mounting: { method: 'none', notes: '' }, fit: null }
	},
	membrane: {
		label: 'Panel trap',
		surface: 'front',
		quantity: 2,
		widthMm: 600,
		heightMm: 1200,
		unitPrice: null,
		problemBandId: null,
		why: null,
		params: { kind: 'membrane', panelThicknessMm: 6, panelStockId: 'plywood', cavityDepthMm: 150, cavityFill: 'porous', frameThicknessMm: 18, mounting: { method: 'none', notes: '' }, fit: null }
	},
	diffuser: {
		label: 'Rear diffuser',
		surface: 'back',
		quantity: 1,
		widthMm: 0,
		heightMm: 1200,
		unitPrice: null,
		problemBandId: null,
		why: null,
		params: { kind: 'diffuser', sequence: 'quadratic-residue', prime: 7, designFrequencyHz: 500, wellWidthMm: 50, finThicknessMm: 6, maxDepthMm: null, boardThicknessMm: 18, construction: 'low-waste', mounting: { method: 'none', notes: '' }, fit: null }
	}
};
