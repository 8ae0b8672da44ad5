// The planner's proposals for a problem band, turned into items a consultant can add as they
// are or adjust first: sizes that suit the kind, the surface where it usually goes.
import { formatHz } from '../format';
import { planTreatment, type PlannerOptions, type Proposal } from '../treatment/planner';
import type { SurfaceId } from '../treatment/surfaces';
import type { PlanItem } from './types';

export type ItemDraft = Omit<PlanItem, 'id'>;

/**
 * Starting sizes and places (common practice, no source): traps in pairs on the front wall's
 * corners, absorbers as 600 × 1200 mm panels at the first-reflection points of the side walls,
 * one diffuser 1200 mm high on the back wall.
 */
const STARTING_POINT: Record<Proposal['kind'], { quantity: number; widthMm: number; heightMm: number; surface: SurfaceId }> = {
	'membrane-trap': { quantity: 2, widthMm: 600, heightMm: 1200, surface: 'front' },
	'porous-absorber': { quantity: 4, widthMm: 600, heightMm: 1200, surface: 'left' },
	diffuser: { quantity: 1, widthMm: 0, heightMm: 1200, surface: 'back' }
};

/** Frame and board thicknesses the drafts assume, mm (common sheet sizes). */
export const DRAFT_FRAME_MM = 18;
export const DRAFT_BOARD_MM = 18;

/** Drafts start without mounting or a fit into an opening; the consultant adds them. */
const NOT_FIXED = { mounting: { method: 'none' as const, notes: '' }, fit: null };

export function draftFromProposal(proposal: Proposal, problemBandId: number | null): ItemDraft {
	const start = STARTING_POINT[proposal.kind];
	const base = { quantity: start.quantity, widthMm: start.widthMm, heightMm: start.heightMm, surface: start.surface, unitPrice: null, problemBandId, why: proposal.why };
	switch (proposal.kind) {
		case 'porous-absorber':
			return {
				...base,
				label: `Absorber ${proposal.layer.thicknessM * 1000} mm${proposal.layer.airGapM > 0 ? ` + ${proposal.layer.airGapM * 1000} gap` : ''}`,
				params: {
					kind: 'porous',
					thicknessMm: Math.round(proposal.layer.thicknessM * 1000),
					airGapMm: Math.round(proposal.layer.airGapM * 1000),
					flowResistivity: proposal.layer.flowResistivity,
					presetId: null,
					model: proposal.layer.model,
					frameThicknessMm: DRAFT_FRAME_MM,
					fabricWrapped: true,
					withBack: proposal.layer.airGapM > 0,
					...NOT_FIXED
				}
			};
		case 'membrane-trap':
			return {
				...base,
				label: `Panel trap ${formatHz(proposal.trap.resonanceHz)}`,
				params: {
					kind: 'membrane',
					panelThicknessMm: proposal.trap.panelThicknessMm,
					panelStockId: 'plywood',
					cavityDepthMm: Math.round(proposal.trap.cavityDepthM * 1000),
					cavityFill: proposal.trap.cavityFill,
					frameThicknessMm: DRAFT_FRAME_MM,
					...NOT_FIXED
				}
			};
		case 'diffuser':
			return {
				...base,
				widthMm: Math.round(proposal.diffuser.panelWidthM * 1000),
				label: `Diffuser N = ${proposal.diffuser.prime}`,
				params: {
					kind: 'diffuser',
					sequence: proposal.diffuser.kind,
					prime: proposal.diffuser.prime,
					designFrequencyHz: Math.round(proposal.diffuser.requestedDesignFrequencyHz),
					wellWidthMm: Math.round(proposal.diffuser.wellWidthM * 1000),
					finThicknessMm: Math.round(proposal.diffuser.finThicknessM * 1000 * 10) / 10,
					// A design frequency raised to fit a depth limit keeps that limit, so the built panel is the proposed one.
					maxDepthMm: proposal.diffuser.designFrequencyHz > proposal.diffuser.requestedDesignFrequencyHz ? Math.floor(proposal.diffuser.deepestWellM * 10000) / 10 : null,
					boardThicknessMm: DRAFT_BOARD_MM,
					// Parts sized to their wells: the same wells from less board (treatment/diffuser-build.ts).
					construction: 'low-waste',
					...NOT_FIXED
				}
			};
	}
}

export interface BandProposals {
	region: ReturnType<typeof planTreatment>['region'];
	notes: string[];
	proposals: { proposal: Proposal; draft: ItemDraft }[];
}

/** Proposals for a problem band, each with the item it would add. */
export function proposalsForBand(band: { id: number; fLoHz: number; fHiHz: number; note?: string }, options: PlannerOptions = {}): BandProposals {
	const plan = planTreatment({ fLoHz: band.fLoHz, fHiHz: band.fHiHz, note: band.note }, options);
	return {
		region: plan.region,
		notes: plan.notes,
		proposals: plan.proposals.map((proposal) => ({ proposal, draft: draftFromProposal(proposal, band.id) }))
	};
}
