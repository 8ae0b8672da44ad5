// The played sweep of a recorded sweep can be changed after its upload — another test signal of
// the practice, or another reference file uploaded — and the capture is analysed again; the
// replaced reference file is deleted, the duplicate rule (same content, channel and reference)
// still holds, and every change is audited. Refusals change nothing and keep no object.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { randomUUID } from 'node:crypto';
import { testDb } from '../helpers/db';
import { makeOrganization, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { acousticianWithProject, signedInClient, type Client } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { encodeWav } from '../../src/lib/analysis';
import { generateExponentialSweep } from '../../src/lib/analysis/sweep';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { runNextJob } from '../../src/lib/server/jobs/runner';
import { getCaptureForAnalysis } from '../../src/lib/server/queries/captures';
import { readJson } from '../../src/lib/server/json-column';

const FIXTURES = join(import.meta.dirname, '../../fixtures');
const s3 = createStorage(loadConfig(process.env));
let k: Knex;
let tree: ProjectTree;
let org: number;
let acoustician: Client;
// The fixture: a 1 s 20 Hz – 20 kHz sweep, and its recording through a synthetic room (1.6 s).
const sweep1s = new Uint8Array(readFileSync(join(FIXTURES, 'sweep-1s-48k.wav')));
const recorded = new Uint8Array(readFileSync(join(FIXTURES, 'sweep-recorded-48k.wav')));
// A 1.58 s sweep: the 1.6 s recording cannot hold it and the room after it, so its analysis fails.
const longSweep = encodeWav(generateExponentialSweep({ f1Hz: 20, f2Hz: 20000, durationS: 1.58, sampleRate: 48000, fadeInS: 0.05, fadeOutS: 0.01, amplitude: 0.5 }).samples, 48000, 16);
let rightSignal: number;
let longSignal: number;
let otherRightSignal: number;

async function storeSignal(name: string, bytes: Uint8Array, durationS: number, organizationId = org): Promise<number> {
	const key = `sweeps/${randomUUID()}.wav`;
	await s3.put(key, bytes, 'audio/wav', bytes.byteLength);
	const [id] = await k('sweep_definitions').insert({ organization_id: organizationId, name, f1_hz: 20, f2_hz: 20000, duration_s: durationS, fade_in_s: 0.05, fade_out_s: 0.01, silence_s: 0, sample_rate: 48000, bit_depth: '16', level_dbfs: -6, object_key: key });
	return id;
}

const json = (method: string, path: string, body?: unknown, as = acoustician) =>
	as.request(method, path, { body: body === undefined ? undefined : JSON.stringify(body), headers: { 'content-type': 'application/json', accept: 'application/json' } });

/** Upload the recorded fixture as a sweep played with the given signal, and settle its analysis. */
async function uploadSweep(sweepDefinitionId: number, channelOrFile: { channel?: number; bytes?: Uint8Array } = {}) {
	const bytes = channelOrFile.bytes ?? recorded;
	const res = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, {
		filename: 'P1-sweep.wav', sizeBytes: bytes.byteLength, sha256: sha256(bytes), kind: 'sweep', positionId: tree.positionId, sweepDefinitionId, channel: channelOrFile.channel ?? 0
	});
	expect(res.status, await res.clone().text()).toBe(201);
	const a = (await res.json()) as { capture: { id: number }; upload: { url: string; headers: Record<string, string> } };
	await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: bytes as Uint8Array<ArrayBuffer> });
	expect((await acoustician.request('POST', `/api/captures/${a.capture.id}/uploaded`)).status).toBe(200);
	await settle(a.capture.id);
	return a.capture.id;
}

const row = (id: number) => k('captures').where({ id }).first();
async function settle(id: number): Promise<void> {
	const done = async () => ['analysed', 'failed'].includes((await row(id)).status);
	for (let i = 0; i < 400 && !(await done()); i++) if (!(await runNextJob(k, s3, { owner: 'reference-test' }))) await new Promise((r) => setTimeout(r, 50));
	expect(await done()).toBe(true);
}
const jobsOf = async (id: number) => Number((await k('jobs').whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [id]).count({ n: '*' }).first())!.n);

async function uploadReference(captureId: number, bytes: Uint8Array): Promise<string> {
	const res = await json('POST', `/api/captures/${captureId}/reference`, { filename: 'played.wav', sizeBytes: bytes.byteLength });
	expect(res.status, await res.clone().text()).toBe(201);
	const a = (await res.json()) as { referenceKey: string; upload: { url: string; headers: Record<string, string> } };
	expect(a.referenceKey).toMatch(/^references\/[0-9a-f-]{36}\.wav$/);
	expect((await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: bytes as Uint8Array<ArrayBuffer> })).status).toBe(200);
	return a.referenceKey;
}

beforeAll(async () => {
	k = testDb();
	({ tree, acoustician } = await acousticianWithProject(k));
	org = (await k('projects').where({ id: tree.projectId }).first('organization_id')).organization_id;
	rightSignal = await storeSignal('Fixture 1 s', sweep1s, 1);
	otherRightSignal = await storeSignal('Fixture 1 s, second copy', sweep1s, 1);
	longSignal = await storeSignal('Long 1.58 s', longSweep, 1.58);
});
afterAll(async () => k.destroy());

describe('changing the played sweep of a capture', () => {
	it('turns a capture analysed with the wrong signal into an analysed one, queued as a re-run is, audited', async () => {
		const id = await uploadSweep(longSignal);
		const failed = await row(id);
		expect(failed.status).toBe('failed');
		expect(failed.error).toMatch(/ends too soon/);
		const jobsBefore = await jobsOf(id);

		const res = await json('PUT', `/api/captures/${id}/reference`, { sweepDefinitionId: rightSignal });
		expect(res.status, await res.clone().text()).toBe(202);
		expect(((await res.json()) as { capture: { status: string } }).capture.status).toBe('queued');
		expect(await row(id)).toMatchObject({ sweep_definition_id: rightSignal, reference_object_key: null, status: 'queued', error: null });
		expect(await jobsOf(id)).toBe(jobsBefore + 1);
		// What the worker will read: the new signal, not the old one.
		expect((await getCaptureForAnalysis(k, id))!.sweep!.durationS).toBe(1);
		const event = await k('audit_events').where({ action: 'capture.reference_changed', entity_id: id }).first();
		expect(readJson(event.details)).toEqual({ from: { sweepDefinitionId: longSignal }, to: { sweepDefinitionId: rightSignal } });

		await settle(id);
		expect((await row(id)).status).toBe('analysed');
		expect(await k('analyses').where({ capture_id: id }).count({ n: '*' }).first()).toEqual({ n: 1 });
	});

	it('takes another reference file uploaded for it, and deletes the replaced file when it goes back to a signal', async () => {
		const id = await uploadSweep(longSignal, { channel: 0, bytes: withTag(recorded, 1) });
		const key = await uploadReference(id, sweep1s);
		// Nothing changes until the file is applied.
		expect((await row(id)).sweep_definition_id).toBe(longSignal);
		const res = await json('PUT', `/api/captures/${id}/reference`, { referenceKey: key });
		expect(res.status, await res.clone().text()).toBe(202);
		expect(await row(id)).toMatchObject({ sweep_definition_id: null, reference_object_key: key, status: 'queued' });
		await settle(id);
		expect((await row(id)).status).toBe('analysed'); // deconvolved against the uploaded 1 s sweep

		// Back to a signal: the uploaded file is no longer used, so it is deleted.
		expect((await json('PUT', `/api/captures/${id}/reference`, { sweepDefinitionId: rightSignal })).status).toBe(202);
		expect(await s3.head(key)).toBeNull();
		expect((await row(id)).reference_object_key).toBeNull();
		await settle(id);
	});

	it('is refused when it would make a duplicate: the same file on the same channel with the same signal', async () => {
		const bytes = withTag(recorded, 2);
		const first = await uploadSweep(rightSignal, { bytes });
		const second = await uploadSweep(otherRightSignal, { bytes }); // another reference: not a duplicate
		const res = await json('PUT', `/api/captures/${second}/reference`, { sweepDefinitionId: rightSignal });
		expect(res.status).toBe(409);
		expect(await res.json()).toMatchObject({ code: 'duplicate', duplicateOf: first });
		expect(await row(second)).toMatchObject({ sweep_definition_id: otherRightSignal, status: 'analysed' });
		expect(await k('audit_events').where({ action: 'capture.reference_changed', entity_id: second }).first()).toBeUndefined();

		// Both with an uploaded reference file would be the same too: refused, and the new file not kept.
		const firstKey = await uploadReference(first, sweep1s);
		expect((await json('PUT', `/api/captures/${first}/reference`, { referenceKey: firstKey })).status).toBe(202);
		await settle(first);
		const secondKey = await uploadReference(second, sweep1s);
		const clash = await json('PUT', `/api/captures/${second}/reference`, { referenceKey: secondKey });
		expect(clash.status).toBe(409);
		expect(await s3.head(secondKey)).toBeNull();
		expect((await row(second)).reference_object_key).toBeNull();
	});

	it('is refused, changing nothing, for what cannot be: on its way, an impulse response, a short recording, another practice, a foreign or bad file', async () => {
		const id = await uploadSweep(rightSignal, { bytes: withTag(recorded, 3) });
		const refuse = async (body: unknown, status: number, text: RegExp, captureId = id) => {
			const res = await json('PUT', `/api/captures/${captureId}/reference`, body);
			expect(res.status).toBe(status);
			expect(((await res.json()) as { message: string }).message).toMatch(text);
		};
		await refuse({ sweepDefinitionId: rightSignal }, 422, /already analysed with/);
		// The 1.6 s recording cannot be of the 1.58 s sweep plus the room after it (the upload check's rule).
		await refuse({ sweepDefinitionId: longSignal }, 422, /shorter than the 1\.58 s sweep/);
		const theirs = await storeSignal('Theirs', sweep1s, 1, await makeOrganization(k));
		await refuse({ sweepDefinitionId: theirs }, 422, /test signal of this organization/);
		await refuse({ referenceKey: 'captures/x.wav' }, 422, /not valid/);
		await refuse({}, 422, /not valid/);

		// Another capture's reference file cannot be borrowed.
		const other = await uploadSweep(rightSignal, { bytes: withTag(recorded, 4) });
		const otherKey = await uploadReference(other, sweep1s);
		expect((await json('PUT', `/api/captures/${other}/reference`, { referenceKey: otherKey })).status).toBe(202);
		await refuse({ referenceKey: otherKey }, 409, /belongs to a capture/);
		expect(await s3.head(otherKey)).not.toBeNull(); // still the other capture's
		// The other capture is queued again now: on its way, so it cannot change meanwhile.
		await refuse({ sweepDefinitionId: otherRightSignal }, 409, /still being uploaded or analysed/, other);
		await settle(other);

		// A reference that is no WAV is refused and not kept.
		const junkKey = await uploadReference(id, new Uint8Array(3000).fill(9));
		await refuse({ referenceKey: junkKey }, 422, /RIFF|WAV/i);
		expect(await s3.head(junkKey)).toBeNull();

		// An impulse response has no sweep to change.
		const wav = decayWav({ seed: 4242, durationS: 0.5 });
		const ir = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, { filename: 'ir.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId });
		const irId = ((await ir.json()) as { capture: { id: number } }).capture.id;
		await refuse({ sweepDefinitionId: rightSignal }, 422, /impulse response/, irId);
		expect((await json('POST', `/api/captures/${irId}/reference`, { filename: 'r.wav', sizeBytes: 5000 })).status).toBe(422);

		expect(await row(id)).toMatchObject({ sweep_definition_id: rightSignal, reference_object_key: null, status: 'analysed' });
	});

	it('is shown to the staff with the choices, and only an acoustician may change it', async () => {
		const id = await uploadSweep(rightSignal, { bytes: withTag(recorded, 5) });
		const seen = await json('GET', `/api/captures/${id}/reference`);
		expect(seen.status).toBe(200);
		const body = (await seen.json()) as { current: unknown; canChange: boolean; sweeps: { id: number }[]; recordingS: number };
		expect(body.current).toEqual({ kind: 'signal', sweepDefinitionId: rightSignal, name: 'Fixture 1 s', durationS: 1 });
		expect(body.canChange).toBe(true);
		expect(body.sweeps.map((s) => s.id).sort()).toEqual([rightSignal, otherRightSignal, longSignal].sort());
		expect(body.recordingS).toBeCloseTo(1.6, 2);

		const consultant = await signedInClient((await makeUser(k, org, 'consultant')).email, TEST_PASSWORD);
		const read = (await (await json('GET', `/api/captures/${id}/reference`, undefined, consultant)).json()) as { canChange: boolean; sweeps: unknown[] };
		expect(read).toMatchObject({ canChange: false, sweeps: [] });
		expect((await json('PUT', `/api/captures/${id}/reference`, { sweepDefinitionId: otherRightSignal }, consultant)).status).toBe(403);
		expect((await json('POST', `/api/captures/${id}/reference`, { filename: 'r.wav', sizeBytes: 5000 }, consultant)).status).toBe(403);
		expect((await row(id)).sweep_definition_id).toBe(rightSignal);
	});
});

/** The recording with a LIST/INFO comment chunk after its data: another file (other bytes), the same sound. */
function withTag(wav: Uint8Array, n: number): Uint8Array {
	const ascii = (t: string) => new TextEncoder().encode(t);
	const comment = ascii(`copy ${n}`.padEnd(8, '\0').slice(0, 8));
	const chunk = new Uint8Array(8 + 4 + 8 + comment.length);
	const view = new DataView(chunk.buffer);
	chunk.set(ascii('LIST'), 0);
	view.setUint32(4, chunk.length - 8, true);
	chunk.set(ascii('INFOICMT'), 8);
	view.setUint32(16, comment.length, true);
	chunk.set(comment, 20);
	const out = new Uint8Array(wav.length + chunk.length);
	out.set(wav, 0);
	out.set(chunk, wav.length);
	new DataView(out.buffer).setUint32(4, out.length - 8, true); // the RIFF size
	return out;
}
