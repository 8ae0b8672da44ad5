// The analysis job: download the capture, check it is the file that was uploaded, run the
// engine (deconvolving a recorded sweep first), and store the result together with the job's
// completion in one transaction.
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { decodeWav, isAnalysisInputError, type AnalysisResult } from '../../analysis';
import { analyseRecordingWithThirds } from '../../analysis/with-thirds';
import { config } from '../config';
import { enqueueMail } from '../mail';
import { sessionAnalysedMail } from '../messages';
import type { Storage } from '../storage';
import { completeInTransaction, type Job } from './queue';
import { transaction } from '../transaction';
import { replaceAnalysis } from '../queries/analyses';
import {
	captureStatusCounts,
	failCapture,
	getCapture,
	getCaptureForAnalysis,
	openCaptureCount,
	setAnalysisState,
	settleAnalysis,
	type CaptureForAnalysis
} from '../queries/captures';
import { takeAnalysedNotice } from '../queries/sessions';
import { storeCaptureLevels } from '../calibrations/apply';

export interface AnalyseCapturePayload {
	captureId: number;
}

/** A failure that retrying will not fix: the capture is marked failed with this reason. */
export class PermanentJobError extends Error {}

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

export async function runAnalysis(ctx: CaptureForAnalysis, s: Storage): Promise<AnalysisResult> {
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
	return analyseRecordingWithThirds(bytes, {
		channel: ctx.channel,
		maxDurationS: config().ANALYSIS_MAX_DURATION_S,
		reference,
		sweep: ctx.sweep ? { f1Hz: ctx.sweep.f1Hz, f2Hz: ctx.sweep.f2Hz, durationS: ctx.sweep.durationS } : undefined,
		room
	});
}

/** When the last capture of a visit is done, tell its acoustician once. */
async function noticeIfSessionDone(trx: Knex.Transaction, sessionId: number): Promise<void> {
	if ((await openCaptureCount(trx, sessionId)) > 0) return;
	const notice = await takeAnalysedNotice(trx, sessionId);
	if (!notice?.acousticianEmail) return;
	const counts = await captureStatusCounts(trx, sessionId);
	const mail = sessionAnalysedMail({
		roomName: notice.roomName,
		condition: notice.conditionLabel,
		analysed: counts.analysed ?? 0,
		failed: counts.failed ?? 0,
		link: `${config().PUBLIC_BASE_URL}/sessions/${sessionId}`
	});
	await enqueueMail(trx, { to: notice.acousticianEmail, kind: 'session-analysed', ...mail });
}

/** Run one analyse-capture job. Throws for a retryable failure; returns when the job is settled. */
export async function handleAnalyseCapture(k: Knex, s: Storage, job: Job<AnalyseCapturePayload>): Promise<'analysed' | 'failed' | 'skipped'> {
	const ctx = await getCaptureForAnalysis(k, job.payload.captureId);
	if (!ctx || !['queued', 'analysing'].includes(ctx.status)) {
		// Deleted, or settled by an earlier run: nothing left to do.
		await k.transaction((trx) => completeInTransaction(trx, job));
		return 'skipped';
	}
	await setAnalysisState(k, ctx.id, 'analysing');

	let result: AnalysisResult | null = null;
	let failure: string | null = null;
	try {
		result = await runAnalysis(ctx, s);
		failure = unusableReason(result);
	} catch (e) {
		if (e instanceof PermanentJobError || isAnalysisInputError(e)) failure = (e as Error).message;
		else {
			await setAnalysisState(k, ctx.id, 'queued');
			throw e;
		}
	}

	// Two workers finishing captures of one visit meet on the visit's row: retry on deadlock.
	await transaction(async (trx) => {
		await completeInTransaction(trx, job);
		await replaceAnalysis(trx, ctx.id, result);
		if (result) await storeCaptureLevels(trx, ctx, result);
		await settleAnalysis(trx, ctx.id, failure);
		await noticeIfSessionDone(trx, ctx.sessionId);
	}, k);
	return failure ? 'failed' : 'analysed';
}

/** After the last retry: the capture fails with a reason a person can act on. */
export async function settleDeadAnalysis(k: Knex, job: Job<AnalyseCapturePayload>, reason: string): Promise<void> {
	await transaction(async (trx) => {
		const capture = await getCapture(trx, job.payload.captureId);
		if (!capture) return;
		await failCapture(trx, capture.id, `The analysis could not run (${reason}). Use "Re-run analysis" to try again.`);
		await noticeIfSessionDone(trx, capture.sessionId);
	}, k);
}
