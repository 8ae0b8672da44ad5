// The capture lifecycle: created (awaiting upload) → uploaded and checked → queued → analysed
// or failed. Every step that touches several rows runs in one transaction; objects are removed
// when their row is, so nothing is left orphaned.
import type { Knex } from 'knex';
import type { z } from 'zod';
import { audit, type Actor } from '../audit';
import { config } from '../config';
import { db } from '../db';
import { cancelCaptureJobs, enqueue } from '../jobs/queue';
import { newObjectKey, storage, type Storage } from '../storage';
import { transaction } from '../transaction';
import { conflict, notFound, Problem } from '../problem';
import { isDuplicateKey } from '../db-errors';
import * as captureRows from '../queries/captures';
import type { CaptureRow } from '../queries/captures';
import { ensurePosition, isPositionOfSession, keepPosition, lockPosition, removeUnkeptPosition } from '../queries/positions';
import { clearAnalysedNotice } from '../queries/sessions';
import { isSweepOfOrganization } from '../queries/sweeps';
import { readWavHeader, WavHeaderError, type WavHeader } from './wav-header';
import type { CreateCaptureInput, updateCaptureSchema } from '../../schemas/captures';
import type { Scope } from '../auth/access';

/**
 * The position a capture goes to: one of its visit's, or the visit's position of a new label —
 * made here when missing (`created`), marked as made for an upload when it is for one.
 */
async function resolvePosition(
	trx: Knex.Transaction,
	sessionId: number,
	input: { positionId?: number; newPositionLabel?: string },
	opts: { forUpload?: boolean } = {}
): Promise<{ id: number; created: boolean } | undefined> {
	if (input.positionId !== undefined) {
		if (!(await isPositionOfSession(trx, sessionId, input.positionId))) throw new Problem(422, 'That position belongs to another visit.', { field: 'positionId' });
		return { id: input.positionId, created: false };
	}
	return input.newPositionLabel === undefined ? undefined : ensurePosition(trx, sessionId, input.newPositionLabel, opts);
}

type UpdateCaptureInput = z.infer<typeof updateCaptureSchema>;

export interface CreatedCapture {
	capture: CaptureRow;
	upload: { url: string; method: 'PUT'; headers: Record<string, string> };
	referenceUpload: { url: string; method: 'PUT'; headers: Record<string, string> } | null;
}

const WAV_TYPE = 'audio/wav';

function duplicateProblem(duplicate: CaptureRow) {
	return conflict(`This file is already in the visit as ${duplicate.filename} (position ${duplicate.positionLabel}).`, {
		code: 'duplicate',
		details: { duplicateOf: duplicate.id }
	});
}

/** Create the capture row (awaiting upload) and presigned PUTs for its file(s). */
export async function createCapture(scope: Scope, sessionId: number, input: CreateCaptureInput, s: Storage = storage()): Promise<CreatedCapture> {
	const k = db();
	const recording = { sha256: input.sha256, channel: input.channel, sweepDefinitionId: input.sweepDefinitionId ?? null, referenceObjectKey: null as string | null };
	if (input.sweepDefinitionId !== undefined && !(await isSweepOfOrganization(k, input.sweepDefinitionId, scope.organizationId))) {
		throw new Problem(422, 'Pick a test signal of this organization.', { field: 'sweepDefinitionId' });
	}
	// Presigning works offline, so ask the store first: if it is down, say so now and write nothing.
	await s.ping();
	const objectKey = newObjectKey('captures');
	const referenceObjectKey = input.reference ? newObjectKey('references') : null;
	recording.referenceObjectKey = referenceObjectKey;
	// Presign first: if storage is misconfigured nothing has been written yet.
	const url = await s.presignPut(objectKey, WAV_TYPE, input.sizeBytes);
	const referenceUrl = referenceObjectKey && input.reference ? await s.presignPut(referenceObjectKey, WAV_TYPE, input.reference.sizeBytes) : null;

	let id: number;
	try {
		id = await transaction(async (trx) => {
			// The visit first, then its positions and captures: one lock order for every change of a
			// visit's captures, and the duplicate check below sees every announcement before it.
			await captureRows.lockSessionForCaptures(trx, sessionId);
			const duplicate = await captureRows.findDuplicate(trx, sessionId, recording);
			if (duplicate) throw duplicateProblem(duplicate);
			// The schema asks for one of the two. A position made here lives or dies with this
			// upload until it is kept (removeCapture).
			const position = (await resolvePosition(trx, sessionId, input, { forUpload: true }))!;
			const id = await captureRows.insertCapture(trx, {
				sessionId,
				positionId: position.id,
				kind: input.kind,
				filename: input.filename,
				objectKey,
				referenceObjectKey,
				sweepDefinitionId: input.sweepDefinitionId ?? null,
				sha256: input.sha256,
				sizeBytes: input.sizeBytes,
				channel: input.channel,
				createdBy: scope.user.id
			});
			await clearAnalysedNotice(trx, sessionId);
			if (position.created) await audit(trx, scope, 'position.created', 'position', position.id, { label: input.newPositionLabel, forCapture: id });
			await audit(trx, scope, 'capture.created', 'capture', id, { filename: input.filename });
			return id;
		});
	} catch (e) {
		// The unique key is the last word (a visit's lock is not taken by every writer of captures).
		if (isDuplicateKey(e)) {
			const duplicate = await captureRows.findDuplicate(k, sessionId, recording);
			if (duplicate) throw duplicateProblem(duplicate);
		}
		throw e;
	}
	const headers = { 'content-type': WAV_TYPE };
	return {
		capture: (await captureRows.getCapture(k, id))!,
		upload: { url, method: 'PUT', headers },
		referenceUpload: referenceUrl ? { url: referenceUrl, method: 'PUT', headers } : null
	};
}

/** Check an uploaded object: present, of the declared size, and a readable WAV header. */
async function checkObject(s: Storage, key: string, declaredSize: number | null, channel: number | null): Promise<WavHeader> {
	const head = await s.head(key);
	if (!head) throw conflict('The file has not arrived in storage yet. Upload it, then confirm.', { code: 'not_uploaded' });
	if (declaredSize !== null && head.size !== declaredSize) {
		throw new Problem(422, `The stored file is ${head.size} bytes but ${declaredSize} were announced: upload it again.`);
	}
	if (head.size > config().UPLOAD_MAX_BYTES) throw new Problem(413, 'The file is larger than the upload limit.');
	const source = { size: head.size, read: (offset: number, length: number) => s.getBytes(key, { start: offset, end: offset + length - 1 }) };
	let header: WavHeader;
	try {
		header = await readWavHeader(source, { maxDurationS: config().ANALYSIS_MAX_DURATION_S });
	} catch (e) {
		if (e instanceof WavHeaderError) throw new Problem(422, e.message);
		throw e;
	}
	if (channel !== null && channel >= header.channels) {
		throw new Problem(422, `Channel ${channel} was chosen but the file has ${header.channels} channel${header.channels === 1 ? '' : 's'} (0–${header.channels - 1}).`);
	}
	return header;
}

/**
 * The browser says the upload is done: confirm the object, then queue the analysis in the same
 * transaction that marks the capture queued. A bad file is refused and removed — row and objects.
 */
export async function confirmUpload(scope: Scope, captureId: number, s: Storage = storage()): Promise<CaptureRow> {
	const k = db();
	const capture = await captureRows.getCapture(k, captureId);
	if (!capture) throw notFound();
	if (capture.status !== 'awaiting_upload') return capture; // idempotent: already confirmed
	let header: WavHeader;
	try {
		header = await checkObject(s, capture.objectKey, capture.sizeBytes, capture.channel);
		if (capture.referenceObjectKey) await checkObject(s, capture.referenceObjectKey, null, null);
	} catch (e) {
		// Not there yet (409) may still arrive, and a store that is briefly down (503) may answer
		// next time; anything else about the file will not get better.
		if (e instanceof Problem && e.status < 500 && e.status !== 409) await removeCapture(scope, capture, s, 'capture.refused', { reason: e.message });
		throw e;
	}
	await transaction(async (trx) => {
		// The position first (one lock order): a capture of it has arrived, so it stays.
		await keepPosition(trx, capture.positionId);
		if (await captureRows.markUploaded(trx, captureId, header)) await enqueue(trx, 'analyse-capture', { captureId });
	});
	return (await captureRows.getCapture(k, captureId))!;
}

/** Upload through the server (for scripted clients): same checks, streamed to storage. */
export async function uploadThroughServer(scope: Scope, sessionId: number, input: CreateCaptureInput, file: File, reference: File | null, s: Storage = storage()): Promise<CaptureRow> {
	const created = await createCapture(scope, sessionId, input, s);
	try {
		// The multipart body is already in memory (the framework parses it whole), so hand the
		// bytes over as they are.
		await s.put(created.capture.objectKey, new Uint8Array(await file.arrayBuffer()), WAV_TYPE, file.size);
		if (reference && created.capture.referenceObjectKey) {
			await s.put(created.capture.referenceObjectKey, new Uint8Array(await reference.arrayBuffer()), WAV_TYPE, reference.size);
		}
	} catch (e) {
		await removeCapture(scope, created.capture, s, 'capture.refused', { reason: 'upload to storage failed' });
		throw e;
	}
	return confirmUpload(scope, created.capture.id, s);
}

/** Rename the file label, or move the capture to another (or a new) position of its visit. */
export async function updateCapture(scope: Scope, captureId: number, input: UpdateCaptureInput): Promise<void> {
	const capture = (await captureRows.getCapture(db(), captureId))!;
	await transaction(async (trx) => {
		await captureRows.lockSessionForCaptures(trx, capture.sessionId);
		const position = await resolvePosition(trx, capture.sessionId, input);
		if (position?.created) await audit(trx, scope, 'position.created', 'position', position.id, { label: input.newPositionLabel });
		await captureRows.updateCaptureLabels(trx, captureId, { filename: input.filename, positionId: position?.id });
		await audit(trx, scope, 'capture.updated', 'capture', captureId, input);
	});
}

/** Write, change or clear (null) a capture's note; the audit record keeps what it said before. */
export async function setCaptureNote(scope: Scope, captureId: number, note: string | null): Promise<void> {
	const capture = await captureRows.getCapture(db(), captureId);
	if (!capture) throw notFound();
	if (capture.note === note) return;
	await transaction(async (trx) => {
		await captureRows.setCaptureNote(trx, captureId, note);
		await audit(trx, scope, 'capture.noted', 'capture', captureId, { from: capture.note, to: note });
	});
}

/** Delete a capture: its objects, its rows (analysis and jobs), and an audit record. */
export async function deleteCapture(scope: Scope, captureId: number, s: Storage = storage()): Promise<void> {
	await removeCapture(scope, (await captureRows.getCapture(db(), captureId))!, s);
}

async function removeCapture(actor: Actor, capture: CaptureRow, s: Storage, action = 'capture.deleted', details: Record<string, unknown> = {}): Promise<void> {
	// Objects first: if storage is down the row stays and the user can try again; a row without
	// an object would be the worse half-state.
	for (const key of [capture.objectKey, capture.referenceObjectKey]) if (key) await s.remove(key);
	await transaction(async (trx) => {
		// The visit, then the position, then the capture: the lock order of every upload.
		await captureRows.lockSessionForCaptures(trx, capture.sessionId);
		await lockPosition(trx, capture.positionId);
		await cancelCaptureJobs(trx, 'analyse-capture', capture.id);
		await captureRows.deleteCaptureRow(trx, capture.id);
		await audit(trx, actor, action, 'capture', capture.id, { filename: capture.filename, sha256: capture.sha256, ...details });
		// A position this upload named into being, still empty and never kept, goes with it.
		if (await removeUnkeptPosition(trx, capture.positionId)) {
			await audit(trx, actor, 'position.deleted', 'position', capture.positionId, { label: capture.positionLabel, withCapture: capture.id });
		}
	});
}

/** Queue the analysis again (after an engine update, or a fix). Skips captures still on their way. */
async function requeueCaptures(scope: Scope, captureIds: number[]): Promise<number> {
	return transaction(async (trx) => {
		let queued = 0;
		for (const id of captureIds) {
			if (await captureRows.requeueSettled(trx, id)) {
				await enqueue(trx, 'analyse-capture', { captureId: id });
				queued++;
			}
		}
		if (queued) await audit(trx, scope, 'capture.requeued', 'capture', captureIds.length === 1 ? captureIds[0] : null, { captureIds });
		return queued;
	});
}

/** Run one capture's analysis again; refused while it is still being uploaded or analysed. */
export async function rerunCapture(scope: Scope, captureId: number): Promise<void> {
	if ((await requeueCaptures(scope, [captureId])) === 0) {
		throw conflict('This capture is still being uploaded or analysed: it can run again once it is done.', { details: { queued: 0 } });
	}
}

/** Run the analysis of every settled capture of a visit again; how many were queued. */
export async function rerunSession(scope: Scope, sessionId: number): Promise<number> {
	return requeueCaptures(scope, await captureRows.captureIdsOfSession(db(), sessionId));
}

/** Uploads announced but never finished (the browser was closed): remove row and any object. */
export async function removeAbandonedUploads(k: Knex, olderThanHours = 24, s: Storage = storage()): Promise<number> {
	const stale = await captureRows.uploadsAwaitingSince(k, new Date(Date.now() - olderThanHours * 3600_000));
	for (const row of stale) {
		const capture = await captureRows.getCapture(k, row.id);
		// Nobody did it: the system itself, on behalf of the capture's organization.
		if (capture) await removeCapture({ organizationId: row.organizationId, user: null }, capture, s, 'capture.abandoned');
	}
	return stale.length;
}
