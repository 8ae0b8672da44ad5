// The capture lifecycle: created (awaiting upload) → uploaded and checked → queued → analysed
// or failed. Every step that touches several rows runs in one transaction; objects are removed
// when their row is, so nothing is left orphaned.
import type { Knex } from 'knex';
import { config } from '../config';
import { db } from '../db';
import { recordAudit } from '../audit';
import { enqueue } from '../jobs/queue';
import { newObjectKey, storage, type Storage } from '../storage';
import { transaction } from '../transaction';
import { Problem } from '../problem';
import { findDuplicate, getCapture, type CaptureRow } from '../queries/captures';
import { HEADER_PROBE_BYTES, inspectWavHeader, WavHeaderError, type WavHeader } from './wav-header';
import type { CreateCaptureInput } from '../../schemas/captures';
import type { Scope } from '../auth/access';


async function resolvePosition(trx: Knex.Transaction, sessionId: number, input: { positionId?: number; newPositionLabel?: string }): Promise<number> {
	if (input.positionId !== undefined) {
		const p = await trx('positions').where({ id: input.positionId, session_id: sessionId }).first('id');
		if (!p) throw new Problem(400, 'That position belongs to another visit.', { field: 'positionId' });
		return p.id;
	}
	const label = input.newPositionLabel!;
	// Two files of a batch may name the same new position at once: insert-or-ignore, then a
	// locking read, which sees the row whichever transaction created it.
	await trx('positions').insert({ session_id: sessionId, label }).onConflict(['session_id', 'label']).ignore();
	const row = await trx('positions').where({ session_id: sessionId, label }).forUpdate().first('id');
	return row.id;
}

export interface CreatedCapture {
	capture: CaptureRow;
	upload: { url: string; method: 'PUT'; headers: Record<string, string> };
	referenceUpload: { url: string; method: 'PUT'; headers: Record<string, string> } | null;
}

const WAV_TYPE = 'audio/wav';

/** Create the capture row (awaiting upload) and presigned PUTs for its file(s). */
export async function createCapture(scope: Scope, sessionId: number, input: CreateCaptureInput, s: Storage = storage()): Promise<CreatedCapture> {
	const k = db();
	const duplicate = await findDuplicate(k, sessionId, input.sha256);
	if (duplicate) {
		throw new Problem(409, `This file is already in the visit as ${duplicate.filename} (position ${duplicate.positionLabel}).`, {
			code: 'duplicate',
			details: { duplicateOf: duplicate.id }
		});
	}
	if (input.sweepDefinitionId !== undefined) {
		const sweep = await k('sweep_definitions').where({ id: input.sweepDefinitionId, organization_id: scope.organizationId }).first('id');
		if (!sweep) throw new Problem(400, 'Pick a test signal of this organization.', { field: 'sweepDefinitionId' });
	}
	// Presigning works offline, so ask the store first: if it is down, say so now and write nothing.
	await s.ping();
	const objectKey = newObjectKey('captures');
	const referenceObjectKey = input.reference ? newObjectKey('references') : null;
	// Presign first: if storage is misconfigured nothing has been written yet.
	const url = await s.presignPut(objectKey, WAV_TYPE, input.sizeBytes);
	const referenceUrl = referenceObjectKey && input.reference ? await s.presignPut(referenceObjectKey, WAV_TYPE, input.reference.sizeBytes) : null;

	const id = await transaction(async (trx) => {
		const positionId = await resolvePosition(trx, sessionId, input);
		const [id] = await trx('captures').insert({
			session_id: sessionId,
			position_id: positionId,
			kind: input.kind,
			original_filename: input.filename,
			object_key: objectKey,
			reference_object_key: referenceObjectKey,
			sweep_definition_id: input.sweepDefinitionId ?? null,
			sha256: input.sha256,
			size_bytes: input.sizeBytes,
			channel: input.channel,
			status: 'awaiting_upload',
			created_by: scope.user.id
		});
		await trx('sessions').where({ id: sessionId }).update({ analysed_notice_at: null });
		await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'capture.created', entityType: 'capture', entityId: id, details: { filename: input.filename } });
		return id;
	});
	const headers = { 'content-type': WAV_TYPE };
	return {
		capture: (await getCapture(k, id))!,
		upload: { url, method: 'PUT', headers },
		referenceUpload: referenceUrl ? { url: referenceUrl, method: 'PUT', headers } : null
	};
}

/** Check an uploaded object: present, of the declared size, and a readable WAV header. */
async function checkObject(s: Storage, key: string, declaredSize: number | null, channel: number | null): Promise<WavHeader> {
	const head = await s.head(key);
	if (!head) throw new Problem(409, 'The file has not arrived in storage yet. Upload it, then confirm.');
	if (declaredSize !== null && head.size !== declaredSize) {
		throw new Problem(422, `The stored file is ${head.size} bytes but ${declaredSize} were announced: upload it again.`);
	}
	if (head.size > config().UPLOAD_MAX_BYTES) throw new Problem(413, 'The file is larger than the upload limit.');
	const bytes = await s.getBytes(key, { start: 0, end: Math.min(head.size, HEADER_PROBE_BYTES) - 1 });
	let header: WavHeader;
	try {
		header = inspectWavHeader(bytes, head.size, { maxDurationS: config().ANALYSIS_MAX_DURATION_S });
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
	const capture = await getCapture(k, captureId);
	if (!capture) throw new Problem(404, 'Not found.');
	if (capture.status !== 'awaiting_upload') return capture; // idempotent: already confirmed
	let header: WavHeader;
	try {
		header = await checkObject(s, capture.objectKey, capture.sizeBytes, capture.channel);
		if (capture.referenceObjectKey) await checkObject(s, capture.referenceObjectKey, null, null);
	} catch (e) {
		if (e instanceof Problem && e.status !== 409) await removeCapture(scope, capture, s, 'capture.refused', { reason: e.message });
		throw e;
	}
	await transaction(async (trx) => {
		const n = await trx('captures').where({ id: captureId, status: 'awaiting_upload' }).update({
			status: 'queued',
			sample_rate: header.sampleRate,
			channels: header.channels,
			duration_s: header.durationS,
			error: null
		});
		if (n === 1) await enqueue(trx, 'analyse-capture', { captureId });
	});
	return (await getCapture(k, captureId))!;
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

/** Delete a capture: its objects, its rows (analysis and jobs), and an audit record. */
export async function removeCapture(scope: Scope, capture: CaptureRow, s: Storage = storage(), action = 'capture.deleted', details: Record<string, unknown> = {}): Promise<void> {
	// Objects first: if storage is down the row stays and the user can try again; a row without
	// an object would be the worse half-state.
	for (const key of [capture.objectKey, capture.referenceObjectKey]) if (key) await s.remove(key);
	await transaction(async (trx) => {
		await trx('jobs').where('type', 'analyse-capture').whereIn('status', ['queued', 'running']).whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [capture.id]).del();
		await trx('captures').where({ id: capture.id }).del();
		await recordAudit(trx, {
			organizationId: scope.organizationId,
			userId: scope.user.id || null, // 0: the system itself (abandoned uploads)
			action,
			entityType: 'capture',
			entityId: capture.id,
			details: { filename: capture.filename, sha256: capture.sha256, ...details }
		});
	});
}

/** Queue the analysis again (after an engine update, or a fix). Skips captures already waiting. */
export async function requeueCaptures(scope: Scope, captureIds: number[]): Promise<number> {
	return transaction(async (trx) => {
		let queued = 0;
		for (const id of captureIds) {
			const n = await trx('captures').where({ id }).whereIn('status', ['analysed', 'failed']).update({ status: 'queued', error: null });
			if (n === 1) {
				await enqueue(trx, 'analyse-capture', { captureId: id });
				queued++;
			}
		}
		if (queued) {
			await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'capture.requeued', entityType: 'capture', entityId: captureIds.length === 1 ? captureIds[0] : null, details: { captureIds } });
		}
			return queued;
	});
}

/** Uploads announced but never finished (the browser was closed): remove row and any object. */
export async function removeAbandonedUploads(k: Knex, olderThanHours = 24, s: Storage = storage()): Promise<number> {
	const stale = await k('captures as c')
		.join('sessions as se', 'se.id', 'c.session_id')
		.join('rooms as r', 'r.id', 'se.room_id')
		.join('projects as p', 'p.id', 'r.project_id')
		.where('c.status', 'awaiting_upload')
		.where('c.created_at', '<', new Date(Date.now() - olderThanHours * 3600_000))
		.select('c.id', 'p.organization_id');
	for (const row of stale) {
		const capture = await getCapture(k, row.id);
		if (!capture) continue;
		const system: Scope = { organizationId: row.organization_id, projectId: null, role: 'admin', user: { id: 0, email: '', name: 'system', unitSystem: 'metric' } };
		await removeCapture(system, capture, s, 'capture.abandoned');
	}
	return stale.length;
}
