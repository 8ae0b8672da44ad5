import type { Knex } from 'knex';
import { PENDING_CAPTURE_STATUSES, type CaptureStatus } from '../../captures/status';
import type { CaptureView } from '../../types/captures';
import { readJson } from '../json-column';
import { pointOf, type Point } from './positions';

export type { CaptureStatus };

/** What the browser is shown of a capture, as stored; the rest stays on the server. */
type SharedFields = 'id' | 'positionId' | 'positionLabel' | 'kind' | 'filename' | 'sizeBytes' | 'sampleRate' | 'channels' | 'channel' | 'durationS' | 'status' | 'error' | 'note';

export interface CaptureRow extends Pick<CaptureView, SharedFields> {
	sessionId: number;
	objectKey: string;
	referenceObjectKey: string | null;
	sweepDefinitionId: number | null;
	sha256: string | null;
	createdAt: Date;
	updatedAt: Date;
}

const columns = {
	id: 'c.id',
	sessionId: 'c.session_id',
	positionId: 'c.position_id',
	positionLabel: 'po.label',
	kind: 'c.kind',
	filename: 'c.original_filename',
	objectKey: 'c.object_key',
	referenceObjectKey: 'c.reference_object_key',
	sweepDefinitionId: 'c.sweep_definition_id',
	sha256: 'c.sha256',
	sizeBytes: 'c.size_bytes',
	sampleRate: 'c.sample_rate',
	channels: 'c.channels',
	channel: 'c.channel',
	durationS: 'c.duration_s',
	status: 'c.status',
	error: 'c.error',
	note: 'c.note',
	createdAt: 'c.created_at',
	updatedAt: 'c.updated_at'
};

const base = (k: Knex) => k('captures as c').join('positions as po', 'po.id', 'c.position_id');

export async function listCaptures(k: Knex, sessionId: number): Promise<CaptureRow[]> {
	return base(k).where('c.session_id', sessionId).orderBy('po.label').orderBy('c.id').select(columns);
}

export type AnalysisSummary = { engineVersion: string; warnings: unknown[]; metrics: { broadband?: Record<string, unknown>; peakToNoiseDb?: number | null } };

// What analysisSummaries reads of a capture's analysis.
const summaryColumns = (k: Knex) => [
	'a.engine_version',
	'a.warnings',
	k.raw("JSON_EXTRACT(a.metrics, '$.broadband') as broadband"),
	k.raw("JSON_EXTRACT(a.metrics, '$.peakToNoiseDb') as peak_to_noise_db")
];

function summaryOf(r: { engine_version: string; warnings: unknown; broadband: unknown; peak_to_noise_db: unknown }): AnalysisSummary {
	return {
		engineVersion: r.engine_version,
		warnings: readJson<unknown[]>(r.warnings),
		metrics: { broadband: r.broadband === null ? undefined : readJson(r.broadband), peakToNoiseDb: r.peak_to_noise_db === null ? undefined : readJson(r.peak_to_noise_db) }
	};
}

/** A capture of a visit with its analysis: the summary lists show, and what names its stored result. */
export interface ListedCapture {
	capture: CaptureRow;
	summary: AnalysisSummary | undefined;
	/** The position's loudspeaker and microphone labels. */
	sourceLabel: string | null;
	micLabel: string | null;
	/** The stored result's row (a re-analysis replaces it), when there is one. */
	analysis: { id: number; engineVersion: string; createdAt: Date | string } | null;
}

/** A visit's captures with their analysis summaries (as analysisSummaries reads them), in one query, by position label then id. */
export async function listCapturesWithSummaries(k: Knex, sessionId: number): Promise<ListedCapture[]> {
	const rows = await base(k)
		.leftJoin('analyses as a', 'a.capture_id', 'c.id')
		.where('c.session_id', sessionId)
		.orderBy('po.label')
		.orderBy('c.id')
		.select(columns, 'po.source_label', 'po.mic_label', 'a.id as analysis_id', 'a.created_at as analysed_at', ...summaryColumns(k));
	return rows.map(({ analysis_id, analysed_at, source_label, mic_label, engine_version, warnings, broadband, peak_to_noise_db, ...capture }) => ({
		capture: capture as CaptureRow,
		summary: analysis_id === null ? undefined : summaryOf({ engine_version, warnings, broadband, peak_to_noise_db }),
		sourceLabel: source_label ?? null,
		micLabel: mic_label ?? null,
		analysis: analysis_id === null ? null : { id: analysis_id, engineVersion: engine_version, createdAt: analysed_at }
	}));
}

export async function getCapture(k: Knex, id: number): Promise<CaptureRow | undefined> {
	return base(k).where('c.id', id).first(columns);
}

/**
 * What a capture was played with, as the `reference_identity` column spells it (see the
 * migration that made it): the test signal's id, an uploaded reference file, or nothing.
 */
export function referenceIdentity(c: { sweepDefinitionId: number | null; referenceObjectKey: string | null }): string {
	if (c.sweepDefinitionId !== null) return `signal:${c.sweepDefinitionId}`;
	return c.referenceObjectKey !== null ? 'uploaded' : '';
}

/**
 * The capture of this visit that is the same recording, on the same channel, with the same
 * reference — other than `exceptId` (a capture whose reference is being changed).
 */
export async function findDuplicate(
	k: Knex,
	sessionId: number,
	recording: { sha256: string; channel: number; sweepDefinitionId: number | null; referenceObjectKey: string | null },
	exceptId?: number
): Promise<CaptureRow | undefined> {
	return base(k)
		.where({ 'c.session_id': sessionId, 'c.sha256': recording.sha256, 'c.channel': recording.channel, 'c.reference_identity': referenceIdentity(recording) })
		.modify((q) => {
			if (exceptId !== undefined) q.whereNot('c.id', exceptId);
		})
		.first(columns);
}

/**
 * Take the visit's row lock before changing its captures. Every transaction that adds or moves
 * captures of a visit takes it first, so they run one after another instead of meeting in the
 * middle (the capture insert's foreign-key check and the visit's notice reset deadlocked).
 */
export async function lockSessionForCaptures(trx: Knex.Transaction, sessionId: number): Promise<boolean> {
	return Boolean(await trx('sessions').where({ id: sessionId }).forUpdate().first('id'));
}

/**
 * Warnings and headline numbers of each capture's analysis, for lists: of the metrics only the
 * broadband values and the peak-to-noise ratio are read (the bands stay in the database).
 */
export async function analysisSummaries(k: Knex, captureIds: number[]): Promise<Map<number, AnalysisSummary>> {
	if (captureIds.length === 0) return new Map();
	const rows = await k('analyses as a')
		.whereIn('a.capture_id', captureIds)
		.select('a.capture_id', ...summaryColumns(k));
	return new Map(rows.map((r) => [r.capture_id as number, summaryOf(r)]));
}

export interface NewCapture {
	sessionId: number;
	positionId: number;
	kind: 'impulse' | 'sweep';
	filename: string;
	objectKey: string;
	referenceObjectKey: string | null;
	sweepDefinitionId: number | null;
	sha256: string;
	sizeBytes: number;
	channel: number;
	createdBy: number;
}

/** A capture announced by the browser, awaiting its upload. */
export async function insertCapture(k: Knex, c: NewCapture): Promise<number> {
	const [id] = await k('captures').insert({
		session_id: c.sessionId,
		position_id: c.positionId,
		kind: c.kind,
		original_filename: c.filename,
		object_key: c.objectKey,
		reference_object_key: c.referenceObjectKey,
		sweep_definition_id: c.sweepDefinitionId,
		sha256: c.sha256,
		size_bytes: c.sizeBytes,
		channel: c.channel,
		status: 'awaiting_upload',
		created_by: c.createdBy
	});
	return id;
}

export async function updateCaptureLabels(k: Knex, id: number, changes: { filename?: string; positionId?: number }): Promise<void> {
	const row: Record<string, unknown> = {};
	if (changes.filename !== undefined) row.original_filename = changes.filename;
	if (changes.positionId !== undefined) row.position_id = changes.positionId;
	if (Object.keys(row).length) await k('captures').where({ id }).update(row);
}

/** Write or clear (null) the capture's note. */
export async function setCaptureNote(k: Knex, id: number, note: string | null): Promise<void> {
	await k('captures').where({ id }).update({ note });
}

/** Awaiting upload → queued, with what its header says; false when an earlier request did it. */
export async function markUploaded(k: Knex, id: number, header: { sampleRate: number; channels: number; durationS: number }): Promise<boolean> {
	const n = await k('captures')
		.where({ id, status: 'awaiting_upload' })
		.update({ status: 'queued', sample_rate: header.sampleRate, channels: header.channels, duration_s: header.durationS, error: null });
	return n === 1;
}

/** Analysed or failed → queued again; false for a capture still on its way. */
export async function requeueSettled(k: Knex, id: number): Promise<boolean> {
	const n = await k('captures').where({ id }).whereIn('status', ['analysed', 'failed']).update({ status: 'queued', error: null });
	return n === 1;
}

/**
 * A settled capture's played sweep changed — a test signal or an uploaded reference file, the
 * other cleared — and queued again; false for a capture still on its way. The duplicate key may
 * refuse it (ER_DUP_ENTRY).
 */
export async function changeReferenceAndRequeue(k: Knex, id: number, reference: { sweepDefinitionId: number | null; referenceObjectKey: string | null }): Promise<boolean> {
	const n = await k('captures')
		.where({ id })
		.whereIn('status', ['analysed', 'failed'])
		.update({ sweep_definition_id: reference.sweepDefinitionId, reference_object_key: reference.referenceObjectKey, status: 'queued', error: null });
	return n === 1;
}

export async function deleteCaptureRow(k: Knex, id: number): Promise<void> {
	await k('captures').where({ id }).del();
}

export async function captureIdsOfSession(k: Knex, sessionId: number): Promise<number[]> {
	return (await k('captures').where({ session_id: sessionId }).select('id')).map((r) => r.id as number);
}

/** Captures still awaiting their upload since before this moment, with their organization. */
export async function uploadsAwaitingSince(k: Knex, before: Date): Promise<{ id: number; organizationId: number }[]> {
	return k('captures as c')
		.join('sessions as se', 'se.id', 'c.session_id')
		.join('rooms as r', 'r.id', 'se.room_id')
		.join('projects as p', 'p.id', 'r.project_id')
		.where('c.status', 'awaiting_upload')
		.where('c.created_at', '<', before)
		.select({ id: 'c.id', organizationId: 'p.organization_id' });
}

/** The analysis has started, or is handed back to the queue after a failure worth retrying. */
export async function setAnalysisState(k: Knex, id: number, status: 'analysing' | 'queued'): Promise<void> {
	await k('captures').where({ id }).update({ status });
}

/** The analysis has run: analysed, or failed with the reason; one more attempt counted. */
export async function settleAnalysis(k: Knex, id: number, failure: string | null): Promise<void> {
	await k('captures')
		.where({ id })
		.update({ status: failure ? 'failed' : 'analysed', error: failure, analysis_attempts: k.raw('analysis_attempts + 1') });
}

/** The analysis could not run at all: failed with the reason. */
export async function failCapture(k: Knex, id: number, reason: string): Promise<void> {
	await k('captures').where({ id }).update({ status: 'failed', error: reason });
}

/** How many captures of a visit are still to be uploaded or analysed. */
export async function openCaptureCount(k: Knex, sessionId: number): Promise<number> {
	const r = await k('captures').where({ session_id: sessionId }).whereIn('status', PENDING_CAPTURE_STATUSES).count({ n: '*' }).first();
	return Number(r?.n ?? 0);
}

/** How many captures of a visit are in each state. */
export async function captureStatusCounts(k: Knex, sessionId: number): Promise<Partial<Record<CaptureStatus, number>>> {
	const rows = (await k('captures').where({ session_id: sessionId }).select('status').count({ n: '*' }).groupBy('status')) as { status: CaptureStatus; n: number | string }[];
	return Object.fromEntries(rows.map((r) => [r.status, Number(r.n)]));
}

/** What the analysis of one capture needs: its file, room, points and test signal. */
export interface CaptureForAnalysis {
	id: number;
	sessionId: number;
	kind: 'impulse' | 'sweep';
	objectKey: string;
	referenceObjectKey: string | null;
	sha256: string | null;
	channel: number;
	status: CaptureStatus;
	room: { lengthM: number; widthM: number; heightM: number };
	source: Point | null;
	mic: Point | null;
	sweep: { objectKey: string; f1Hz: number; f2Hz: number; durationS: number } | null;
}

export async function getCaptureForAnalysis(k: Knex, id: number): Promise<CaptureForAnalysis | undefined> {
	const r = await k('captures as c')
		.join('positions as po', 'po.id', 'c.position_id')
		.join('sessions as s', 's.id', 'c.session_id')
		.join('rooms as r', 'r.id', 's.room_id')
		.leftJoin('sweep_definitions as sd', 'sd.id', 'c.sweep_definition_id')
		.where('c.id', id)
		.first(
			'c.id', 'c.session_id', 'c.kind', 'c.object_key', 'c.reference_object_key', 'c.sha256', 'c.channel', 'c.status',
			'r.length_m', 'r.width_m', 'r.height_m',
			'po.source_x_m', 'po.source_y_m', 'po.source_z_m', 'po.mic_x_m', 'po.mic_y_m', 'po.mic_z_m',
			'sd.object_key as sweep_key', 'sd.f1_hz', 'sd.f2_hz', 'sd.duration_s as sweep_duration_s'
		);
	if (!r) return undefined;
	return {
		id: r.id,
		sessionId: r.session_id,
		kind: r.kind,
		objectKey: r.object_key,
		referenceObjectKey: r.reference_object_key,
		sha256: r.sha256,
		channel: r.channel,
		status: r.status,
		room: { lengthM: Number(r.length_m), widthM: Number(r.width_m), heightM: Number(r.height_m) },
		source: pointOf(r, 'source'),
		mic: pointOf(r, 'mic'),
		sweep: r.sweep_key ? { objectKey: r.sweep_key, f1Hz: r.f1_hz, f2Hz: r.f2_hz, durationS: r.sweep_duration_s } : null
	};
}
