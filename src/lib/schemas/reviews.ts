import { z } from 'zod';

export const SEVERITIES = ['minor', 'moderate', 'severe'] as const;
export const SEVERITY_LABELS: Record<(typeof SEVERITIES)[number], string> = { minor: 'Minor', moderate: 'Moderate', severe: 'Severe' };

// The audible range a room measurement can speak for; outside it a band is a typing error.
export const PROBLEM_BAND_LIMITS = { minHz: 10, maxHz: 24_000, maxMs: 10_000 } as const;

const optionalMs = z
	.union([z.literal(''), z.null(), z.coerce.number()])
	.optional()
	.transform((v) => (v === '' || v === null || v === undefined ? null : v))
	.refine((v) => v === null || (Number.isFinite(v) && v >= 0 && v <= PROBLEM_BAND_LIMITS.maxMs), { error: `A time between 0 and ${PROBLEM_BAND_LIMITS.maxMs} ms.` });

const hz = (label: string) =>
	z.coerce
		.number({ error: `Enter the ${label} frequency in Hz.` })
		.refine(Number.isFinite, { error: `Enter the ${label} frequency in Hz.` })
		.refine((v) => v >= PROBLEM_BAND_LIMITS.minHz && v <= PROBLEM_BAND_LIMITS.maxHz, {
			error: `The ${label} frequency must lie between ${PROBLEM_BAND_LIMITS.minHz} Hz and ${PROBLEM_BAND_LIMITS.maxHz / 1000} kHz.`
		});

export const problemBandSchema = z
	.object({
		fLoHz: hz('lower'),
		fHiHz: hz('upper'),
		tLoMs: optionalMs,
		tHiMs: optionalMs,
		severity: z.enum(SEVERITIES, { error: 'Pick a severity.' }),
		note: z.string({ error: 'Describe the problem.' }).trim().min(1, { error: 'Describe the problem.' }).max(2000),
		comparisonId: z
			.union([z.literal(''), z.null(), z.coerce.number().int().positive()])
			.optional()
			.transform((v) => (v === '' || v === null || v === undefined ? null : v))
	})
	.refine((v) => v.fLoHz < v.fHiHz, { path: ['fHiHz'], error: 'The upper frequency must be above the lower one.' })
	.refine((v) => v.tLoMs === null || v.tHiMs === null || v.tLoMs < v.tHiMs, { path: ['tHiMs'], error: 'The end time must be after the start time.' });

export const problemBandStatusSchema = z.object({ status: z.enum(['open', 'addressed'], { error: 'Open or addressed.' }) });

export const comparisonSchema = z
	.object({
		baselineSessionId: z.coerce.number({ error: 'Pick the visit before treatment.' }).int().positive({ error: 'Pick the visit before treatment.' }),
		treatedSessionId: z.coerce.number({ error: 'Pick the visit after treatment.' }).int().positive({ error: 'Pick the visit after treatment.' }),
		title: z.string().trim().min(1, { error: 'Give the comparison a title.' }).max(200)
	})
	.refine((v) => v.baselineSessionId !== v.treatedSessionId, { path: ['treatedSessionId'], error: 'Pick two different visits.' });

export const adviceSchema = z.object({
	advice: z.string().trim().max(20_000, { error: 'Keep the advice under 20,000 characters.' }),
	shareQualityNotes: z
		.union([z.literal('on'), z.literal('true'), z.literal('')])
		.optional()
		.transform((v) => v === 'on' || v === 'true')
});
