import { z } from 'zod';
import { CALIBRATOR_LEVEL_RANGE_DB_SPL } from '../analysis/calibration';

/** Channels of capture files count from 0 (the capture schema allows 8). */
export const MAX_CHANNEL = 7;
/** Calibrator recordings and correction files come through the form, inside the request body limit. */
export const CALIBRATOR_MAX_BYTES = 1_000_000;
export const CORRECTION_MAX_BYTES = 256 * 1024;

/** "" or absent: the chain is for every channel of the visit. */
const chainChannel = z
	.union([z.literal(''), z.coerce.number({ error: 'Pick a channel.' }).int({ error: 'Pick a channel.' }).min(0, { error: 'Channels count from 0.' }).max(MAX_CHANNEL, { error: `At most ${MAX_CHANNEL + 1} channels (0–${MAX_CHANNEL}).` })])
	.optional()
	.transform((v) => (v === '' || v === undefined ? null : v));

const label = z
	.string()
	.trim()
	.max(120, { error: 'At most 120 characters.' })
	.optional()
	.transform((v) => (v ? v : null));

export const calibrateSchema = z.object({
	channel: chainChannel,
	label,
	statedLevelDbSpl: z.coerce
		.number({ error: 'Give the calibrator level, e.g. 94 or 114 dB.' })
		.min(CALIBRATOR_LEVEL_RANGE_DB_SPL.min, { error: `Between ${CALIBRATOR_LEVEL_RANGE_DB_SPL.min} and ${CALIBRATOR_LEVEL_RANGE_DB_SPL.max} dB SPL (calibrators give 94 or 114 dB).` })
		.max(CALIBRATOR_LEVEL_RANGE_DB_SPL.max, { error: `Between ${CALIBRATOR_LEVEL_RANGE_DB_SPL.min} and ${CALIBRATOR_LEVEL_RANGE_DB_SPL.max} dB SPL (calibrators give 94 or 114 dB).` }),
	fileChannel: z.coerce.number().int().min(0, { error: 'Channels count from 0.' }).max(MAX_CHANNEL).default(0)
});
export type CalibrateInput = z.infer<typeof calibrateSchema>;

export const correctionSchema = z.object({
	channel: chainChannel,
	label,
	sense: z.enum(['deviation', 'correction'], { error: 'Say whether the file holds the microphone’s deviation or the correction to add.' }).default('deviation')
});
export type CorrectionInput = z.infer<typeof correctionSchema>;

export const chainPartSchema = z.object({ channel: chainChannel });
