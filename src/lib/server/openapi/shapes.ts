// The shapes the API answers with, as zod schemas for the description. Requests are described by
// the schemas the routes parse with (src/lib/schemas); answers are built by the services, so
// their shapes are written here — the ones with a TypeScript type are checked against it below,
// and the integration test parses real answers with them.
import { z } from 'zod';
import type { ZodOpenApiResponseObject } from 'zod-openapi';
import { CAPTURE_STATUSES } from '../../captures/status';
import { CAPTURE_KINDS } from '../../schemas/captures';
import { CAPTURE_BANDS_SCHEMA, COMPARISON_SCHEMA, SESSION_AVERAGE_SCHEMA } from '../../results/exports';
import { CUT_LIST_SCHEMA } from '../../plans/exports';
import type { CaptureView } from '../../types/captures';
import type { ProblemBandView } from '../../results/types';
import type { ComparisonResponses, VisitResponses } from '../../results/drawn';

/** Every refusal: `message` for people, `code` for scripts, `errors` per field. */
export const problemSchema = z
	.object({
		message: z.string().meta({ description: 'What went wrong, in words a person can act on.' }),
		code: z.string().optional().meta({ description: 'A stable name for scripts: invalid, not_json, duplicate, conflict, not_uploaded, capture_failed, too_large, unavailable…' }),
		errors: z.record(z.string(), z.string()).optional().meta({ description: 'Per field (dotted path into the body), the message about it.' }),
		errorId: z.string().optional().meta({ description: 'Set on unexpected errors: quote it when reporting a fault.' })
	})
	.loose()
	.meta({ id: 'Problem', description: 'A refusal. Some carry more properties, named in the operation (duplicateOf, queued).' });

const nullableNumber = z.number().nullable();

export const captureWarningSchema = z
	.object({
		code: z.string().meta({ description: 'What kind of quality note (clipping, low dynamic range, wrong channel…).' }),
		band: z.number().nullable().meta({ description: 'Nominal band centre in Hz the note is about; null for the whole capture.' }),
		message: z.string()
	})
	.meta({ id: 'CaptureWarning' });

export const captureSchema = z
	.object({
		id: z.number().int(),
		positionId: z.number().int(),
		positionLabel: z.string(),
		kind: z.enum(CAPTURE_KINDS),
		filename: z.string(),
		sizeBytes: z.number().int().nullable(),
		sampleRate: z.number().int().nullable().meta({ description: 'Read from the WAV header once uploaded.' }),
		channels: z.number().int().nullable(),
		channel: z.number().int().meta({ description: 'The channel analysed, counted from 0.' }),
		durationS: z.number().nullable(),
		status: z.enum(CAPTURE_STATUSES).meta({ description: 'awaiting_upload → queued → analysing → analysed or failed.' }),
		error: z.string().nullable().meta({ description: 'Why the analysis failed, when it did.' }),
		note: z.string().nullable().meta({ description: 'A remark on the capture\'s conditions ("door open").' }),
		engineVersion: z.string().nullable(),
		warnings: z.array(captureWarningSchema),
		headline: z
			.object({ t30S: nullableNumber, t20S: nullableNumber, edtS: nullableNumber, c80Db: nullableNumber, peakToNoiseDb: nullableNumber })
			.nullable()
			.meta({ description: 'Broadband values once analysed.' }),
		updatedAt: z.iso.datetime()
	})
	.meta({ id: 'Capture', description: 'A capture\'s state and, once analysed, its headline numbers and quality notes.' });

export const captureEnvelopeSchema = z.object({ capture: captureSchema });

export const presignedUploadSchema = z
	.object({
		url: z.url().meta({ description: 'Presigned URL of the object store; valid for 15 minutes.' }),
		method: z.literal('PUT'),
		headers: z.record(z.string(), z.string()).meta({ description: 'Send exactly these headers (and the announced Content-Length).' })
	})
	.meta({ id: 'PresignedUpload' });

export const createdCaptureSchema = z.object({
	capture: captureSchema,
	upload: presignedUploadSchema,
	referenceUpload: presignedUploadSchema.nullable().meta({ description: 'Where to PUT the reference sweep, when one was announced.' })
});

export const sessionCapturesSchema = z.object({
	captures: z.array(captureSchema),
	pending: z.number().int().meta({ description: 'How many are still awaiting upload, queued or being analysed.' })
});

export const queuedSchema = z.object({ queued: z.number().int().meta({ description: 'How many analyses were queued.' }) });

const bandValuesSchema = z
	.object({
		centerHz: z.number().meta({ description: 'Nominal mid-band frequency (ISO 266).' }),
		exactHz: z.number(),
		edtS: nullableNumber,
		t20S: nullableNumber,
		t30S: nullableNumber,
		c50Db: nullableNumber,
		c80Db: nullableNumber,
		d50: nullableNumber,
		tsMs: nullableNumber,
		peakToNoiseDb: nullableNumber,
		curvaturePct: nullableNumber,
		biased: z.boolean()
	})
	.loose()
	.meta({ id: 'BandValues', description: 'ISO 3382 parameters of one band (null where a decay could not be evaluated).' });

export const storedAnalysisSchema = z
	.object({
		engineVersion: z.string(),
		metrics: z
			.object({ sampleRate: z.number(), channels: z.number(), durationS: z.number(), bandKind: z.string(), broadband: bandValuesSchema, bands: z.array(bandValuesSchema) })
			.loose()
			.meta({ description: 'Per band and broadband parameters, reflections, quality and deconvolution details.' }),
		warnings: z.array(captureWarningSchema),
		curves: z.record(z.string(), z.unknown()).meta({ description: 'Decimated chart curves: response, decays, energy–time curve.' })
	})
	.meta({ id: 'StoredAnalysis' });

export const captureBandsExportSchema = z
	.object({
		schema: z.literal(CAPTURE_BANDS_SCHEMA),
		note: z.string().nullable().meta({ description: 'The capture\'s note on its conditions ("door open"), null when it has none.' }),
		bands: z.array(bandValuesSchema),
		broadband: bandValuesSchema
	})
	.loose();

const averagesSchema = z.record(z.string(), z.unknown()).meta({ description: 'Per metric (edtS, t20S, t30S, c50Db, c80Db, d50, tsMs): mean, spread and count over the positions.' });

export const sessionAverageExportSchema = z.object({
	schema: z.literal(SESSION_AVERAGE_SCHEMA),
	sessionId: z.number().int(),
	conditionLabel: z.string(),
	measuredOn: z.string(),
	positions: z.array(z.object({ positionLabel: z.string(), captureId: z.number().int() })),
	bands: z.array(z.object({ centerHz: z.number(), metrics: averagesSchema })),
	broadband: averagesSchema,
	outliers: z.array(z.record(z.string(), z.unknown())),
	averageResponse: z.object({ freqHz: z.array(z.number()), db: z.array(z.number()) }).nullable(),
	statistics: z.record(z.string(), z.unknown()).meta({ description: 'Per band the spread of each metric with its 95 % interval, σ of T20/T30 (ISO 3382-2), T_mid and the grade.' }),
	thirds: z.record(z.string(), z.unknown()).nullable()
});

export const problemBandSchema = z
	.object({
		id: z.number().int(),
		fLoHz: z.number(),
		fHiHz: z.number(),
		tLoMs: nullableNumber,
		tHiMs: nullableNumber,
		severity: z.enum(['minor', 'moderate', 'severe']),
		note: z.string(),
		status: z.enum(['open', 'addressed'])
	})
	.meta({ id: 'ProblemBand', description: 'A band the consultant marked on the room\'s charts.' });

export const roomSummarySchema = z
	.object({ id: z.number().int(), name: z.string(), lengthM: z.number(), widthM: z.number(), heightM: z.number() })
	.loose()
	.meta({ id: 'RoomSummary', description: 'A room\'s name and dimensions (m); the comparison adds its volume and use.' });

export const comparisonSchema = z.object({
	comparison: z
		.object({
			id: z.number().int(),
			roomId: z.number().int(),
			baselineSessionId: z.number().int(),
			treatedSessionId: z.number().int(),
			title: z.string(),
			advice: z.string(),
			shareQualityNotes: z.boolean(),
			publishedAt: z.iso.datetime().nullable(),
			createdAt: z.iso.datetime()
		})
		.meta({ id: 'Comparison' }),
	room: roomSummarySchema,
	model: z
		.object({ baseline: z.record(z.string(), z.unknown()), treated: z.record(z.string(), z.unknown()), differences: z.array(z.unknown()), target: z.array(z.unknown()) })
		.loose()
		.meta({ description: 'Both visits\' averages with their position curves, band differences, target and verdicts, and the summary in plain words.' }),
	problemBands: z.array(problemBandSchema)
});

export const comparisonExportSchema = z.object({
	schema: z.literal(COMPARISON_SCHEMA),
	room: z.record(z.string(), z.unknown()),
	baseline: z.object({ sessionId: z.number().int(), conditionLabel: z.string(), measuredOn: z.string() }),
	treated: z.object({ sessionId: z.number().int(), conditionLabel: z.string(), measuredOn: z.string() }),
	matchedPositions: z.array(z.string()),
	baselineOnly: z.array(z.string()),
	treatedOnly: z.array(z.string()),
	bands: z.array(z.object({ centerHz: z.number() }).loose().meta({ description: 'Per band: differences per metric, the target, verdicts before and after, judgements.' })),
	positions: z.array(z.object({ positionLabel: z.string() }).loose()),
	statistics: z.object({ baseline: z.record(z.string(), z.unknown()), treated: z.record(z.string(), z.unknown()) }),
	thirds: z.record(z.string(), z.unknown()).nullable()
});

const measuredVisitSchema = z
	.object({ sessionId: z.number().int(), conditionLabel: z.string(), measuredOn: z.string(), positions: z.number().int(), times: z.record(z.string(), z.unknown()) })
	.nullable();

export const planSchema = z.object({
	room: roomSummarySchema,
	plan: z.object({ items: z.array(z.unknown()), settings: z.record(z.string(), z.unknown()) }).loose().meta({ description: 'The stored plan: items, stock sheets, settings.' }),
	before: measuredVisitSchema.meta({ description: 'The measured visit the prediction starts from, if chosen.' }),
	after: measuredVisitSchema.meta({ description: 'The visit measured after treatment, if chosen.' }),
	evaluation: z.record(z.string(), z.unknown()).meta({ description: 'Predicted reverberation time per band beside target and measurement.' }),
	cost: z.record(z.string(), z.unknown()).meta({ description: 'Material cost of the plan.' })
});

export const cutListExportSchema = z.object({
	schema: z.literal(CUT_LIST_SCHEMA),
	room: z.string(),
	kerfMm: z.number(),
	problem: z.string().nullable().meta({ description: 'Why no cut list could be laid out, when it could not.' }),
	sheets: z.array(z.unknown()),
	yieldPct: z.number().nullable(),
	pieces: z.array(z.record(z.string(), z.unknown()))
});

export const binary = (description: string) => z.string().meta({ format: 'binary', description });

/** How the results answers with an entity tag behave. */
export const TAGGED =
	'The answer carries an entity tag (ETag, Cache-Control: private, no-cache): send it back as If-None-Match and unchanged results are answered 304 without a body. The tag changes when a capture is analysed again, a position is renamed or the room changes.';
export const ifNoneMatch = z.object({ 'if-none-match': z.string().optional().meta({ description: 'The ETag of an answer already held.' }) });

/** The answers of a route with an entity tag: 200 with the tag, or 304. */
export function taggedResponses(description: string, schema: z.ZodType): Record<number, ZodOpenApiResponseObject> {
	return {
		200: { description, headers: z.object({ etag: z.string().meta({ description: 'Entity tag of these results.' }) }), content: { 'application/json': { schema } } },
		304: { description: 'Unchanged since the entity tag sent in If-None-Match.' }
	};
}

const smoothingSchema = z.enum(['1', '3', '6', '12', '24']).meta({ description: '1/N-octave smoothing.' });
const curveSchema = z
	.object({ freqHz: z.array(z.number()), db: z.array(z.number()) })
	.meta({ id: 'SmoothedCurve', description: 'Levels in dB (relative) at 48 points per octave.' });

export const visitResponsesSchema = z.object({
	smoothing: smoothingSchema,
	positions: z.array(curveSchema.extend({ captureId: z.number().int(), positionLabel: z.string() })).meta({ description: 'Each position\'s latest analysed capture.' }),
	average: curveSchema.nullable().meta({ description: 'The power average over the positions.' })
});

export const visitBandsSchema = z.object({
	bandKind: z.enum(['octave', 'third']),
	positions: z.array(
		z.object({
			captureId: z.number().int(),
			positionLabel: z.string(),
			bands: z.array(z.object({ centerHz: z.number(), t30S: nullableNumber, t20S: nullableNumber, edtS: nullableNumber, c80Db: nullableNumber, c50Db: nullableNumber }))
		})
	),
	average: z.array(z.object({ centerHz: z.number(), values: averagesSchema })),
	statistics: z.record(z.string(), z.unknown()).meta({ description: 'Per band the spread of each metric with its 95 % interval, σ of T20/T30 (ISO 3382-2), T_mid and the grade.' })
});

export const comparisonResponsesSchema = z.object({
	smoothing: smoothingSchema,
	before: curveSchema.nullable().meta({ description: 'The baseline visit\'s average response.' }),
	after: curveSchema.nullable().meta({ description: 'The treated visit\'s average response.' })
});

export const comparisonBandsSchema = z.object({
	bandKind: z.enum(['octave', 'third']),
	differences: z.array(z.object({ centerHz: z.number(), metrics: z.record(z.string(), z.unknown()) })).meta({ description: 'Per band and metric: before, after, difference and relative change.' }),
	judgements: z.array(z.object({ centerHz: z.number(), metrics: z.record(z.string(), z.unknown()) })).meta({ description: 'Per band and metric: the difference judged against the spread and the JND.' })
});

// The written shapes follow the types the services build (a changed type fails the type check here).
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : false) : false;
const sameCapture: Same<z.output<typeof captureSchema>, CaptureView> = true;
const sameProblemBand: Same<z.output<typeof problemBandSchema>, ProblemBandView> = true;
void sameCapture;
void sameProblemBand;
const sameVisitResponses: Same<z.output<typeof visitResponsesSchema>, VisitResponses> = true;
const sameComparisonResponses: Same<z.output<typeof comparisonResponsesSchema>, ComparisonResponses> = true;
void sameVisitResponses;
void sameComparisonResponses;
