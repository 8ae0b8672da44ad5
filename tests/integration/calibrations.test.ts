import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { encodeWav } from '../../src/lib/analysis';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { runNextJob } from '../../src/lib/server/jobs/runner';
import { readJson } from '../../src/lib/server/json-column';
import type { CaptureLevels } from '../../src/lib/analysis/input-chain';

// Input chains of a visit through the running app: a calibrator recording and a microphone
// correction uploaded by form, the captures analysed again with the offset and correction,
// refusals with the reason, and nobody outside the project reaching any of it.
let k: Knex;
let tree: ProjectTree;
let acoustician: Client, consultant: Client, client: Client, outsider: Client;
const s3 = createStorage(loadConfig(process.env));
const FS = 48_000;

/** A calibrator recording from formulas: 0.5 s of silence, 4 s of a sine at `hz` and amplitude A, 0.5 s of silence, 16-bit. */
function toneWav(amplitude: number, hz = 1000): Uint8Array {
	const x = new Float64Array(5 * FS);
	for (let i = FS / 2; i < 4.5 * FS; i++) x[i] = amplitude * Math.sin((2 * Math.PI * hz * i) / FS);
	return encodeWav(x, FS, 16);
}
// AES17: a sine of amplitude A reads 20·lg A dBFS; IEC 60942 calibrator at 94 dB SPL.
const TONE_AMPLITUDE = 0.05;
const STATED_DB = 94;
const EXPECTED_OFFSET = STATED_DB - 20 * Math.log10(TONE_AMPLITUDE); // 120.02 dB

function multipart(fields: Record<string, string>, file?: { name: string; bytes: Uint8Array; type: string }): FormData {
	const body = new FormData();
	for (const [key, value] of Object.entries(fields)) body.set(key, value);
	if (file) body.set('file', new File([file.bytes as Uint8Array<ArrayBuffer>], file.name, { type: file.type }));
	return body;
}
const calibratePath = () => `/sessions/${tree.sessionId}/calibration?/calibrate`;
const correctPath = () => `/sessions/${tree.sessionId}/calibration?/correct`;
const post = (who: Client, path: string, body: FormData) => who.request('POST', path, { body, headers: { accept: 'text/html' } });
const postCalibrator = (who: Client, wav = toneWav(TONE_AMPLITUDE), fields: Record<string, string> = {}) =>
	post(who, calibratePath(), multipart({ formId: 'calibrate', statedLevelDbSpl: String(STATED_DB), ...fields }, { name: 'calibrator.wav', bytes: wav, type: 'audio/wav' }));
const postCorrection = (who: Client, text: string, fields: Record<string, string> = {}) =>
	post(who, correctPath(), multipart({ formId: 'correct', sense: 'deviation', ...fields }, { name: 'mic.txt', bytes: new TextEncoder().encode(text), type: 'text/plain' }));

async function uploadCapture(wav: Uint8Array): Promise<number> {
	const res = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, { filename: 'P1-ir.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId });
	expect(res.status, await res.clone().text()).toBe(201);
	const a = (await res.json()) as { capture: { id: number }; upload: { url: string; headers: Record<string, string> } };
	expect((await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: wav as Uint8Array<ArrayBuffer> })).status).toBe(200);
	expect((await acoustician.request('POST', `/api/captures/${a.capture.id}/uploaded`, { headers: { accept: 'application/json' } })).status).toBe(200);
	return a.capture.id;
}

/** Run queued jobs in this process until the capture is settled. */
async function drain(captureId: number): Promise<void> {
	for (let i = 0; i < 80; i++) {
		const row = await k('captures').where({ id: captureId }).first('status');
		if (!['queued', 'analysing'].includes(row.status)) return;
		if (!(await runNextJob(k, s3, { owner: 'calibration-test' }))) await new Promise((r) => setTimeout(r, 50));
	}
	throw new Error('capture did not settle');
}

async function levelsOf(captureId: number): Promise<{ calibrated: boolean; levels: CaptureLevels; metrics: string }> {
	const row = await k('analyses').where({ capture_id: captureId }).first('levels', 'levels_calibrated', 'metrics');
	return { calibrated: Boolean(row.levels_calibrated), levels: readJson<CaptureLevels>(row.levels), metrics: JSON.stringify(readJson(row.metrics)) };
}
const chainRow = () => k('input_chains').where({ session_id: tree.sessionId }).first();

let captureId: number;
let relative: CaptureLevels;

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	const otherOrg = await makeOrganization(k);
	const a = await makeUser(k, org, 'acoustician');
	const c = await makeUser(k, org, 'consultant');
	const cl = await makeUser(k, org, 'client');
	const o = await makeUser(k, otherOrg, 'acoustician');
	tree = await makeProjectTree(k, org, cl.id);
	[acoustician, consultant, client, outsider] = await Promise.all([a, c, cl, o].map((u) => signedInClient(u.email, TEST_PASSWORD)));
	captureId = await uploadCapture(decayWav({ t60S: 0.6, seed: 41 }));
	await drain(captureId);
});
afterAll(async () => k.destroy());

describe('a capture of a visit without calibration', () => {
	it('has relative band levels, flagged as not calibrated, and the visit page says so', async () => {
		const { calibrated, levels } = await levelsOf(captureId);
		expect(calibrated).toBe(false);
		expect(levels.axisLabel).toBe('dB (relative)');
		expect(levels.bands.filter((b) => b.levelDb !== null).length).toBeGreaterThanOrEqual(6);
		relative = levels;
		const page = await (await acoustician.get(`/sessions/${tree.sessionId}`, { accept: 'text/html' })).text();
		expect(page).toContain('dB (relative)');
		expect(page).not.toContain('dB SPL');
	});
});

describe('calibrating the visit from a calibrator recording', () => {
	it('stores the chain with its offset, keeps the recording, audits, and analyses the capture again with every band shifted by the offset (within 0.1 dB)', async () => {
		const before = await levelsOf(captureId);
		const res = await postCalibrator(acoustician);
		expect(res.status, await res.clone().text()).toBe(200);
		const row = await chainRow();
		// The stated level minus the tone's dBFS (AES17), for a tone of amplitude 0.05 (−26.02 dBFS).
		expect(Math.abs(Number(row.offset_db) - EXPECTED_OFFSET)).toBeLessThan(0.1);
		expect(Number(row.stated_level_db_spl)).toBe(STATED_DB);
		expect(row.channel).toBeNull();
		expect(row.calibrator_object_key).toMatch(/^calibrators\/[0-9a-f-]{36}\.wav$/);
		expect((await s3.head(row.calibrator_object_key))?.size).toBe(toneWav(TONE_AMPLITUDE).byteLength);
		const record = await k('audit_events').where({ action: 'calibration.set', entity_id: row.id }).first();
		expect(readJson<{ queued: number }>(record.details).queued).toBe(1);

		expect((await k('captures').where({ id: captureId }).first()).status).toBe('queued');
		await drain(captureId);
		const after = await levelsOf(captureId);
		expect(after.calibrated).toBe(true);
		expect(after.levels.axisLabel).toBe('dB SPL');
		for (const band of after.levels.bands) {
			const was = relative.bands.find((b) => b.centerHz === band.centerHz)!.levelDb;
			if (was === null) expect(band.levelDb).toBeNull();
			else expect(Math.abs(band.levelDb! - was - EXPECTED_OFFSET), `${band.centerHz} Hz`).toBeLessThan(0.1);
		}
		// The engine's own numbers are those of the same file, analysed again.
		expect(after.metrics).toBe(before.metrics);

		const page = await (await acoustician.get(`/sessions/${tree.sessionId}`, { accept: 'text/html' })).text();
		expect(page).toContain('dB SPL');
	});

	it('replaces the calibration and its recording when calibrated again (by a consultant of the project)', async () => {
		const old = (await chainRow()).calibrator_object_key;
		const res = await postCalibrator(consultant, toneWav(0.1), { statedLevelDbSpl: '114', label: 'mic A' });
		expect(res.status).toBe(200);
		const row = await chainRow();
		expect(Math.abs(Number(row.offset_db) - (114 - 20 * Math.log10(0.1)))).toBeLessThan(0.1);
		expect(row.label).toBe('mic A');
		expect(await k('input_chains').where({ session_id: tree.sessionId }).count({ n: '*' }).first()).toEqual({ n: 1 });
		expect(await s3.head(old)).toBeNull();
		await drain(captureId);
	});

	it('refuses a recording that is not a 1 kHz calibrator tone with the reason, and changes nothing', async () => {
		const before = await chainRow();
		const res = await postCalibrator(acoustician, toneWav(0.05, 250));
		expect(res.status).toBe(422);
		expect(await res.text()).toMatch(/No calibration from this recording: .*1 kHz/);
		expect(await chainRow()).toEqual(before);
	});

	it('refuses a stated level no calibrator gives (400 beside the field)', async () => {
		const res = await postCalibrator(acoustician, toneWav(TONE_AMPLITUDE), { statedLevelDbSpl: '9.4' });
		expect(res.status).toBe(400);
		expect(await res.text()).toContain('Between 60 and 150 dB SPL');
	});
});

describe('a microphone correction file', () => {
	it('malformed: 400 naming the line, beside the file field, nothing stored', async () => {
		const res = await postCorrection(acoustician, '* serial 1234\n20 0.5\n1000 abc\n20000 -1\n');
		expect(res.status).toBe(400);
		const html = await res.text();
		expect(html).toContain('Line 3 of the correction file');
		expect((await chainRow()).correction_points).toBeNull();
		expect(await k('jobs').whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [captureId]).whereIn('status', ['queued', 'running']).count({ n: '*' }).first()).toEqual({ n: 0 });
	});

	it('well formed: stored with its points, the capture analysed again with the deviation taken out at each band', async () => {
		const calibrated = (await levelsOf(captureId)).levels;
		// A microphone 2 dB hot everywhere (flat beyond its ends): every band 2 dB lower.
		const res = await postCorrection(acoustician, '# test microphone\n20 2.0\n20000 2.0\n');
		expect(res.status).toBe(200);
		expect(readJson<unknown[]>((await chainRow()).correction_points)).toHaveLength(2);
		await drain(captureId);
		const corrected = (await levelsOf(captureId)).levels;
		expect(corrected.correction).toMatchObject({ filename: 'mic.txt', sense: 'deviation' });
		for (const band of corrected.bands.filter((b) => b.levelDb !== null)) {
			const was = calibrated.bands.find((b) => b.centerHz === band.centerHz)!.levelDb!;
			expect(band.levelDb! - was).toBeCloseTo(-2, 1);
		}
	});
});

describe('who may reach a visit’s calibration', () => {
	it('a client of the project may not open or change it (403); an acoustician of another organization does not find it (404)', async () => {
		const before = await chainRow();
		expect((await client.get(`/sessions/${tree.sessionId}/calibration`, { accept: 'text/html' })).status).toBe(403);
		// Refused before the body is read, so a small body: a large one would be cut off mid-send.
		const small = () => multipart({ formId: 'calibrate', statedLevelDbSpl: '94' }, { name: 'calibrator.wav', bytes: new Uint8Array(64), type: 'audio/wav' });
		expect((await post(client, calibratePath(), small())).status).toBe(403);
		expect((await postCorrection(client, '20 0\n20000 0\n')).status).toBe(403);
		expect((await outsider.get(`/sessions/${tree.sessionId}/calibration`, { accept: 'text/html' })).status).toBe(404);
		expect((await post(outsider, calibratePath(), small())).status).toBe(404);
		expect((await post(outsider, `/sessions/${tree.sessionId}/calibration?/removeCalibration`, multipart({ channel: '' }))).status).toBe(404);
		expect(await chainRow()).toEqual(before);
		// The client's visit page shows no calibration panel at all.
		const page = await (await client.get(`/sessions/${tree.sessionId}`, { accept: 'text/html' })).text();
		expect(page).not.toContain('Calibration and levels');
	});
});

describe('removing the calibration', () => {
	it('deletes the recording, audits, and the capture is analysed again to relative levels (the correction stays)', async () => {
		const row = await chainRow();
		const res = await post(acoustician, `/sessions/${tree.sessionId}/calibration?/removeCalibration`, multipart({ formId: 'remove', channel: '' }));
		expect(res.status).toBe(200);
		expect(await s3.head(row.calibrator_object_key)).toBeNull();
		expect(await k('audit_events').where({ action: 'calibration.removed', entity_id: row.id }).first()).toBeTruthy();
		const after = await chainRow();
		expect(after.offset_db).toBeNull();
		expect(after.correction_points).not.toBeNull();
		await drain(captureId);
		const { calibrated, levels } = await levelsOf(captureId);
		expect(calibrated).toBe(false);
		for (const band of levels.bands.filter((b) => b.levelDb !== null)) {
			expect(band.levelDb! - relative.bands.find((b) => b.centerHz === band.centerHz)!.levelDb!).toBeCloseTo(-2, 1);
		}
	});
});
