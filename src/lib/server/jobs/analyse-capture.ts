// The analysis job: download the capture, check it is the file that was uploaded, run the
// engine (deconvolving a recorded sweep first), and store the result together with the job's
// completion in one transaction.
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { analyseRecording, decodeWav, isAnalysisInputError, type AnalysisResult } from '../../analysis';
import { config } from '../config';
import { enqueueMail } from '../mail';
import { sessionAnalysedMail } from '../messages';
import type { Storage } from '../storage';
import { completeInTransaction, type Job } from './queue';
import { transaction } from '../transaction';

export interface AnalyseCapturePayload {
	captureId: number;
}

/** A failure that retrying will not fix: the capture is marked failed with this reason. */
export class PermanentJobError extends Error {}

interface CaptureContext {
	id: number;
	sessionId: number;
	kind: 'impulse' | 'sweep';
	objectKey: string;
	referenceObjectKey: string | null;
	sha256: string | null;
	channel: number;
	status: string;
	room: { lengthM: number; widthM: number; heightM: number };
	source: { x: number; y: number; z: number } | null;
	mic: { x: number; y: number; z: number } | null;
	sweep: { objectKey: string; f1Hz: number; f2Hz: number; durationS: number } | null;
}

async function loadContext(k: Knex, captureId: number): Promise<CaptureContext | null> {
	const r = await k('captures as c')
		.join('positions as po', 'po.id', 'c.position_id')
		.join('sessions as s', 's.id', 'c.session_id')
		.join('rooms as r', 'r.id', 's.room_id')
		.leftJoin('sweep_definitions as sd', 'sd.id', 'c.sweep_definition_id')
		.where('c.id', captureId)
		.first(
			'c.id', 'c.session_id', 'c.kind', 'c.object_key', 'c.reference_object_key', 'c.sha256', 'c.channel', 'c.status',
			'r.length_m', 'r.width_m', 'r.height_m',
			'po.source_x_m', 'po.source_y_m', 'po.source_z_m', 'po.mic_x_m', 'po.mic_y_m', 'po.mic_z_m',
			'sd.object_key as sweep_key', 'sd.f1_hz', 'sd.f2_hz', 'sd.duration_s as sweep_duration_s'
		);
	if (!r) return null;
	const point = (x: unknown, y: unknown, z: unknown) => (x == null || y == null || z == null ? null : { x: Number(x), y: Number(y), z: Number(z) });
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
		source: point(r.source_x_m, r.source_y_m, r.source_z_m),
		mic: point(r.mic_x_m, r.mic_y_m, r.mic_z_m),
		sweep: r.sweep_key ? { objectKey: r.sweep_key, f1Hz: r.f1_hz, f2Hz: r.f2_hz, durationS: r.sweep_duration_s } : null
	};
}

/** Split a result into what lists and tables need (metrics) and what only charts need (curves). */
export function splitResult(result: AnalysisResult) {
	const { curves, warnings, ...metrics } = result;
	return { metrics, curves, warnings };
}

/**
 * A capture whose decay cannot be trusted at all has nothing to show: it fails, with the
 * engine's own reason (which says what to do about it).
 */
export function unusableReason(result: AnalysisResult): string | null {
	const b = result.broadband;
	if (b.edtS !== null || b.t20S !== null || b.t30S !== null) return null;
	const why = result.warnings.find((w) => w.band === null) ?? result.warnings[0];
	return why ? why.message : 'No part of the decay rises clearly above the background noise: measure louder or longer.';
}

export async function runAnalysis(ctx: CaptureContext, s: Storage): Promise<AnalysisResult> {
	const bytes = await s.getBytes(ctx.objectKey);
	const digest = createHash('sha256').update(bytes).digest('hex');
	if (ctx.sha256 && digest !== ctx.sha256) {
		throw new PermanentJobError('The stored file is not the one that was uploaded (its SHA-256 differs): upload it again.');
	}
	let reference: Float64Array | undefined;
	if (ctx.kind === 'sweep') {
		const key = ctx.sweep?.objectKey ?? ctx.referenceObjectKey;
		if (!key) throw new PermanentJobError('This recorded sweep has no reference sweep to deconvolve it with.');
		reference = decodeWav(await s.getBytes(key), { maxDurationS: config().ANALYSIS_MAX_DURATION_S }).samples;
	}
	const room = ctx.source && ctx.mic ? { ...ctx.room, source: ctx.source, mic: ctx.mic } : ctx.room;
	return analyseRecording(bytes, {
		channel: ctx.channel,
		maxDurationS: config().ANALYSIS_MAX_DURATION_S,
		reference,
		sweep: ctx.sweep ? { f1Hz: ctx.sweep.f1Hz, f2Hz: ctx.sweep.f2Hz, durationS: ctx.sweep.durationS } : undefined,
		room,
		bands: 'octave'
	});
}

/** When the last capture of a visit is done, tell its acoustician once. */
async function noticeIfSessionDone(trx: Knex.Transaction, sessionId: number): Promise<void> {
	const open = await trx('captures').where({ session_id: sessionId }).whereIn('status', ['awaiting_upload', 'queued', 'analysing']).count({ n: '*' }).first();
	if (Number(open?.n ?? 0) > 0) return;
	const s = await trx('sessions as s')
		.join('rooms as r', 'r.id', 's.room_id')
		.leftJoin('users as u', 'u.id', 's.acoustician_id')
		.where('s.id', sessionId)
		.whereNull('s.analysed_notice_at')
		.forUpdate()
		.first('s.id', 's.condition_label', 'r.name as room_name', 'u.email');
	if (!s) return;
	await trx('sessions').where({ id: sessionId }).update({ analysed_notice_at: trx.raw('CURRENT_TIMESTAMP(3)') });
	if (!s.email) return;
	const counts = (await trx('captures').where({ session_id: sessionId }).select('status').count({ n: '*' }).groupBy('status')) as { status: string; n: number | string }[];
	const n = (status: string) => Number(counts.find((c) => c.status === status)?.n ?? 0);
	const mail = sessionAnalysedMail({
		roomName: s.room_name,
		condition: s.condition_label,
		analysed: n('analysed'),
		failed: n('failed'),
		link: `${config().PUBLIC_BASE_URL}/sessions/${sessionId}`
	});
	await enqueueMail(trx, { to: s.email, kind: 'session-analysed', ...mail });
}

/** Run one analyse-capture job. Throws for a retryable failure; returns when the job is settled. */
export async function handleAnalyseCapture(k: Knex, s: Storage, job: Job<AnalyseCapturePayload>): Promise<'analysed' | 'failed' | 'skipped'> {
	const ctx = await loadContext(k, job.payload.captureId);
	if (!ctx || !['queued', 'analysing'].includes(ctx.status)) {
		// Deleted, or settled by an earlier run: nothing left to do.
		await k.transaction((trx) => completeInTransaction(trx, job));
		return 'skipped';
	}
	await k('captures').where({ id: ctx.id }).update({ status: 'analysing' });

	let result: AnalysisResult | null = null;
	let failure: string | null = null;
	try {
		result = await runAnalysis(ctx, s);
		failure = unusableReason(result);
	} catch (e) {
		if (e instanceof PermanentJobError || isAnalysisInputError(e)) failure = (e as Error).message;
		else {
			await k('captures').where({ id: ctx.id }).update({ status: 'queued' });
			throw e;
		}
	}

	// Two workers finishing captures of one visit meet on the visit's row: retry on deadlock.
	await transaction(async (trx) => {
		await completeInTransaction(trx, job);
		await trx('analyses').where({ capture_id: ctx.id }).del();
		if (result) {
			const { metrics, curves, warnings } = splitResult(result);
			await trx('analyses').insert({
				capture_id: ctx.id,
				engine_version: result.engineVersion,
				metrics: JSON.stringify(metrics),
				curves: JSON.stringify(curves),
				warnings: JSON.stringify(warnings)
			});
		}
		await trx('captures')
			.where({ id: ctx.id })
			.update({ status: failure ? 'failed' : 'analysed', error: failure, analysis_attempts: trx.raw('analysis_attempts + 1') });
		await noticeIfSessionDone(trx, ctx.sessionId);
	}, k);
	return failure ? 'failed' : 'analysed';
}

/** After the last retry: the capture fails with a reason a person can act on. */
export async function settleDeadAnalysis(k: Knex, job: Job<AnalyseCapturePayload>, reason: string): Promise<void> {
	await transaction(async (trx) => {
		const c = await trx('captures').where({ id: job.payload.captureId }).first('session_id');
		if (!c) return;
		await trx('captures').where({ id: job.payload.captureId }).update({ status: 'failed', error: `The analysis could not run (${reason}). Use "Re-run analysis" to try again.` });
		await noticeIfSessionDone(trx, c.session_id);
	}, k);
}
