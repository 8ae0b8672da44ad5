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
import { ensurePosition, isPositionOfSession, isUnkeptPosition, keepPosition, lockPosition, removeUnkeptPosition } from '../queries/positions';
import { clearAnalysedNotice } from '../queries/sessions';
import { isSweepOfOrganization } from '../queries/sweeps';
import { readWavHeader, WavHeaderError, type WavHeader } from './wav-header';
import { readCaptureUpload } from './multipart';
import { checkStagedHeader, stageFile } from './staged-upload';
import { discardRequestBody } from '../body-limit';
import type { CreateCaptureInput, updateCaptureSchema } from '../../schemas/captures';
import type { Scope } from '../auth/access';
import { getSweep, listSweeps } from '../queries/sweeps';
import { knownObjectKeys } from '../queries/objects';
import { isPendingStatus } from '../../captures/status';
import { sweepMismatch } from '../../captures/sweep-fit';
import { roleAllows } from '../../roles';
import type { ChangeReferenceInput } from '../../schemas/capture-reference';

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

/**
 * Create the capture row (awaiting upload) and presigned PUTs for its file(s). `stored` names
 * objects the server has stored already (a scripted upload); the row takes their keys.
 */
export async function createCapture(
	scope: Scope,
	sessionId: number,
	input: CreateCaptureInput,
	s: Storage = storage(),
	stored?: { objectKey: string; referenceObjectKey: string | null }
): Promise<CreatedCapture> {
	const k = db();
	const recording = { sha256: input.sha256, channel: input.channel, sweepDefinitionId: input.sweepDefinitionId ?? null, referenceObjectKey: null as string | null };
	if (input.sweepDefinitionId !== undefined && !(await isSweepOfOrganization(k, input.sweepDefinitionId, scope.organizationId))) {
		throw new Problem(422, 'Pick a test signal of this organization.', { field: 'sweepDefinitionId' });
	}
	// Presigning works offline, so ask the store first: if it is down, say so now and write nothing.
	await s.ping();
	const objectKey = stored?.objectKey ?? newObjectKey('captures');
	const referenceObjectKey = stored ? stored.referenceObjectKey : input.reference ? newObjectKey('references') : null;
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
		// A position this upload made is kept now that a capture of it has arrived. Only then are
		// locks taken, in the one order (the visit, its position, then the capture), so confirms
		// into positions that are already kept add no wait to the announcements running beside them.
		if (await isUnkeptPosition(trx, capture.positionId)) {
			await captureRows.lockSessionForCaptures(trx, capture.sessionId);
			await keepPosition(trx, capture.positionId);
		}
		if (await captureRows.markUploaded(trx, captureId, header)) await enqueue(trx, 'analyse-capture', { captureId });
	});
	return (await captureRows.getCapture(k, captureId))!;
}

/**
 * Upload through the server (for scripted clients), streamed: each file of the multipart body
 * goes to storage as it arrives, under a key of its own, counted, hashed and its header checked
 * on the way (see staged-upload.ts), so memory holds a few parts of it, never the file. Size and
 * SHA-256 are known when the body has ended; then the announcement is checked as the JSON
 * route's is (duplicates included), and the capture is created over the stored objects and
 * confirmed. Whatever is refused or fails leaves no row, and the objects are removed (if the
 * store is down by then, the orphaned-object sweep removes them a day later).
 */
export async function uploadThroughServer(scope: Scope, sessionId: number, request: Request, s: Storage = storage()): Promise<CaptureRow> {
	try {
		await s.ping(); // before the body is read: a store that is down is said so at once
	} catch (e) {
		discardRequestBody(request);
		throw e;
	}
	const c = config();
	const limits = { maxBytes: c.UPLOAD_MAX_BYTES, maxDurationS: c.ANALYSIS_MAX_DURATION_S };
	const staged: string[] = [];
	const removeStaged = async () => {
		for (const key of staged.splice(0)) await s.remove(key).catch(() => {});
	};
	let created: CaptureRow | null = null;
	try {
		const { input, file, reference } = await readCaptureUpload(
			request,
			(part) => {
				const key = newObjectKey(part.name === 'file' ? 'captures' : 'references');
				staged.push(key);
				return stageFile(s, key, part, limits);
			},
			removeStaged
		);
		await checkStagedHeader(s, file, { name: 'file' }, input.channel, limits.maxDurationS);
		if (reference) await checkStagedHeader(s, reference, { name: 'reference' }, null, limits.maxDurationS);
		created = (await createCapture(scope, sessionId, input, s, { objectKey: file.key, referenceObjectKey: reference?.key ?? null })).capture;
		return await confirmUpload(scope, created.id, s);
	} catch (e) {
		// A refusal at confirm has removed the row already; one that stays (the store went down
		// meanwhile) goes with its objects here.
		const row = created && (await captureRows.getCapture(db(), created.id));
		if (row) await removeCapture(scope, row, s, 'capture.refused', { reason: e instanceof Error ? e.message : String(e) }).catch(() => {});
		await removeStaged();
		throw e;
	}
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

// ---- The played sweep of a recorded sweep, changed after its upload ------------------------

const STILL_ON_ITS_WAY = 'This capture is still being uploaded or analysed: its sweep can be changed once it is done.';

/** What a recorded sweep was played with: a test signal, an uploaded reference file, or nothing. */
export type PlayedReference = { kind: 'signal'; sweepDefinitionId: number; name: string; durationS: number } | { kind: 'uploaded' } | { kind: 'none' };

/** The capture page's panel: what the capture was played with, and what it may be changed to. */
export async function referenceChoices(scope: Scope, captureId: number) {
	const k = db();
	const capture = (await captureRows.getCapture(k, captureId))!;
	const canChange = capture.kind === 'sweep' && roleAllows(scope.role, 'capture:write');
	const sweep = capture.sweepDefinitionId !== null ? await getSweep(k, capture.sweepDefinitionId) : undefined;
	const current: PlayedReference = sweep
		? { kind: 'signal', sweepDefinitionId: sweep.id, name: sweep.name, durationS: sweep.durationS }
		: capture.referenceObjectKey
			? { kind: 'uploaded' }
			: { kind: 'none' };
	const sweeps = canChange ? await listSweeps(k, scope.organizationId) : [];
	return {
		kind: capture.kind,
		status: capture.status,
		recordingS: capture.durationS,
		current,
		sweeps: sweeps.map((s) => ({ id: s.id, name: s.name, durationS: s.durationS })),
		canChange
	};
}

/** Refusals that do not depend on what the capture is changed to. */
function checkChangeable(capture: CaptureRow): void {
	if (capture.kind !== 'sweep') throw new Problem(422, 'An impulse response is analysed as it is: it has no played sweep to change.', { code: 'not_a_sweep' });
	if (isPendingStatus(capture.status)) throw conflict(STILL_ON_ITS_WAY, { code: 'capture_busy' });
}

/**
 * A presigned PUT for another reference file of a recorded sweep. Nothing changes yet: the file
 * is applied with `changeReference` once it is stored (an object never applied is swept after a
 * day, as no row names it).
 */
export async function announceReference(scope: Scope, captureId: number, input: { filename: string; sizeBytes: number }, s: Storage = storage()) {
	const capture = (await captureRows.getCapture(db(), captureId))!;
	checkChangeable(capture);
	await s.ping();
	const referenceKey = newObjectKey('references');
	const url = await s.presignPut(referenceKey, WAV_TYPE, input.sizeBytes);
	return { referenceKey, upload: { url, method: 'PUT' as const, headers: { 'content-type': WAV_TYPE } } };
}

const describeReference = (r: { sweepDefinitionId: number | null; referenceObjectKey: string | null }) =>
	r.sweepDefinitionId !== null ? { sweepDefinitionId: r.sweepDefinitionId } : r.referenceObjectKey ? { referenceFile: true } : {};

/**
 * Change the played sweep of a settled recorded sweep — another test signal of the organization,
 * or a reference file uploaded under a key `announceReference` handed out — and analyse it again.
 * Refused (nothing changed) when it is still on its way, when the recording is too short for the
 * chosen test signal, or when the visit already holds the same file on the same channel with that
 * reference (a duplicate). The replaced reference file is deleted once no row names it; a refused
 * new one is deleted at once.
 */
export async function changeReference(scope: Scope, captureId: number, input: ChangeReferenceInput, s: Storage = storage()): Promise<CaptureRow> {
	const k = db();
	const capture = (await captureRows.getCapture(k, captureId))!;
	const newKey = input.referenceKey ?? null;
	// A new file the change does not take is not kept — once it is known to be no row's file.
	let newKeyIsFree = false;
	const discardNew = async () => {
		if (newKey && newKeyIsFree) await s.remove(newKey).catch(() => undefined); // else the orphaned-object sweep takes it
	};
	let next: { sweepDefinitionId: number | null; referenceObjectKey: string | null };
	try {
		checkChangeable(capture);
		if (input.sweepDefinitionId !== undefined) {
			const sweep = await getSweep(k, input.sweepDefinitionId);
			if (!sweep || !(await isSweepOfOrganization(k, sweep.id, scope.organizationId))) {
				throw new Problem(422, 'Pick a test signal of this organization.', { field: 'sweepDefinitionId' });
			}
			if (capture.sweepDefinitionId === sweep.id) {
				throw new Problem(422, `This capture is already analysed with "${sweep.name}": run its analysis again instead.`, { field: 'sweepDefinitionId', code: 'unchanged' });
			}
			const mismatch = capture.durationS !== null ? sweepMismatch(capture.durationS, sweep) : null;
			if (mismatch) throw new Problem(422, mismatch, { field: 'sweepDefinitionId', code: 'sweep_mismatch' });
			next = { sweepDefinitionId: sweep.id, referenceObjectKey: null };
		} else {
			if ((await knownObjectKeys(k, 'references/', [newKey!])).size > 0) {
				throw conflict('That reference file belongs to a capture already: upload the file for this one.', { field: 'referenceKey' });
			}
			newKeyIsFree = true;
			await checkObject(s, newKey!, null, null);
			next = { sweepDefinitionId: null, referenceObjectKey: newKey };
		}
	} catch (e) {
		await discardNew();
		throw e;
	}
	const recording = { sha256: capture.sha256, channel: capture.channel, ...next };
	try {
		await transaction(async (trx) => {
			await captureRows.lockSessionForCaptures(trx, capture.sessionId);
			// Same content, channel and reference as another capture of the visit: that one stands.
			const duplicate = recording.sha256 ? await captureRows.findDuplicate(trx, capture.sessionId, { ...recording, sha256: recording.sha256 }, captureId) : undefined;
			if (duplicate) throw duplicateProblem(duplicate);
			if (!(await captureRows.changeReferenceAndRequeue(trx, captureId, next))) throw conflict(STILL_ON_ITS_WAY, { code: 'capture_busy' });
			await enqueue(trx, 'analyse-capture', { captureId });
			await audit(trx, scope, 'capture.reference_changed', 'capture', captureId, { from: describeReference(capture), to: describeReference(next) });
		});
	} catch (e) {
		await discardNew();
		if (isDuplicateKey(e) && recording.sha256) {
			const duplicate = await captureRows.findDuplicate(k, capture.sessionId, { ...recording, sha256: recording.sha256 }, captureId);
			if (duplicate) throw duplicateProblem(duplicate);
		}
		throw e;
	}
	// The replaced file, unless some row still names it; if the store is down now, the
	// orphaned-object sweep removes it later.
	const old = capture.referenceObjectKey;
	if (old && old !== next.referenceObjectKey && !(await knownObjectKeys(k, 'references/', [old])).has(old)) {
		await s.remove(old).catch(() => undefined);
	}
	return (await captureRows.getCapture(k, captureId))!;
}
