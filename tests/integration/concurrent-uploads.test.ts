// A busy visit: many files announced, uploaded and confirmed at once through the running server,
// as a browser's upload queue (or several browsers) would do. Every request must succeed; the
// same file announced several times at once is accepted exactly once.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { type ProjectTree } from '../helpers/factories';
import { acousticianWithProject, type Client } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';

let k: Knex;
let tree: ProjectTree;
let acoustician: Client;

interface Outcome {
	step: 'announce' | 'put' | 'confirm';
	status: number;
	body: string;
	captureId?: number;
}

/** Announce, PUT to the presigned URL, confirm: the first step that does not succeed, or the confirm. */
async function upload(client: Client, sessionId: number, wav: Uint8Array, placement: Record<string, unknown>, channel = 0): Promise<Outcome> {
	const announced = await client.postJson(`/api/sessions/${sessionId}/captures`, {
		filename: `take-${sha256(wav).slice(0, 8)}.wav`,
		sizeBytes: wav.byteLength,
		sha256: sha256(wav),
		kind: 'impulse',
		channel,
		...placement
	});
	if (announced.status !== 201) return { step: 'announce', status: announced.status, body: await announced.text() };
	const a = (await announced.json()) as { capture: { id: number }; upload: { url: string; headers: Record<string, string> } };
	const put = await fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: wav as Uint8Array<ArrayBuffer> });
	if (put.status !== 200) return { step: 'put', status: put.status, body: await put.text(), captureId: a.capture.id };
	const confirmed = await client.request('POST', `/api/captures/${a.capture.id}/uploaded`, { headers: { accept: 'application/json' } });
	return { step: 'confirm', status: confirmed.status, body: await confirmed.text(), captureId: a.capture.id };
}

beforeAll(async () => {
	k = testDb();
	({ tree, acoustician } = await acousticianWithProject(k));
});
afterAll(async () => {
	// The 50-odd analyses queued here are not this file's subject: drop them, so later files that run
	// the queue in process do not spend their turns on them.
	const ids = (await k('captures').where({ session_id: tree.sessionId }).pluck('id')) as number[];
	if (ids.length) await k('jobs').whereRaw(`JSON_VALUE(payload, '$.captureId') IN (${ids.map(() => '?').join(',')})`, ids).delete();
	await k.destroy();
});

describe('concurrent uploads into one visit', () => {
	it('50 announce + upload + confirm at once: 0 errors, 50 captures queued with one job each', async () => {
		const files = Array.from({ length: 50 }, (_, i) => decayWav({ seed: 5000 + i, durationS: 0.4 }));
		// A third go to the visit's existing position; the rest name ten new positions, five files
		// each, so several requests create the same position at the same moment.
		const placements = files.map((_, i) => (i % 3 === 0 ? { positionId: tree.positionId } : { newPositionLabel: `Seat ${i % 10}` }));
		const outcomes = await Promise.all(files.map((wav, i) => upload(acoustician, tree.sessionId, wav, placements[i])));

		const errors = outcomes.filter((o) => o.step !== 'confirm' || o.status !== 200);
		expect(errors.length, JSON.stringify(errors.slice(0, 5))).toBe(0);

		const ids = outcomes.map((o) => o.captureId!);
		const rows = await k('captures').whereIn('id', ids).select('status', 'position_id');
		expect(rows.map((r) => r.status)).toEqual(Array(50).fill('queued'));
		const jobs = await k('jobs').whereRaw(`JSON_VALUE(payload, '$.captureId') IN (${ids.map(() => '?').join(',')})`, ids).select('status');
		expect(jobs).toHaveLength(50);
		// Ten new positions, each made once however many requests named it at once.
		const positions = await k('positions').where({ session_id: tree.sessionId }).select('label');
		expect(positions.map((p) => p.label).sort()).toEqual(['P1', ...Array.from({ length: 10 }, (_, i) => `Seat ${i}`)].sort());
		expect(new Set(rows.map((r) => r.position_id)).size).toBe(11);
	}, 120_000);

	it('the same file announced four times at once is accepted once and refused three times with 409', async () => {
		const wav = decayWav({ seed: 6001, durationS: 0.4 });
		const body = { filename: 'twice.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId, channel: 0 };
		const answers = await Promise.all(Array.from({ length: 4 }, () => acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, body)));
		const statuses = answers.map((a) => a.status).sort();
		expect(statuses).toEqual([201, 409, 409, 409]);
		const refusals = await Promise.all(answers.filter((a) => a.status === 409).map((a) => a.json()));
		const [accepted] = await k('captures').where({ session_id: tree.sessionId, sha256: sha256(wav) }).select('id');
		for (const r of refusals) {
			expect(r.code).toBe('duplicate');
			expect(r.message).toMatch(/already in the visit/);
			expect(r.duplicateOf).toBe(accepted.id);
		}
		expect(await k('captures').where({ session_id: tree.sessionId, sha256: sha256(wav) }).count({ n: '*' }).first()).toEqual({ n: 1 });
	}, 60_000);

	it('the same file on another channel is another capture; on the same channel it is a duplicate', async () => {
		const wav = decayWav({ seed: 6002, durationS: 0.4 });
		const first = await upload(acoustician, tree.sessionId, wav, { positionId: tree.positionId }, 0);
		expect(first.status, first.body).toBe(200);
		// A two-channel file would carry both microphones; a mono file's channel 1 is refused at
		// confirm, so only the announcement is checked here.
		const otherChannel = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, {
			filename: 'again.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId, channel: 1
		});
		expect(otherChannel.status, await otherChannel.clone().text()).toBe(201);
		const sameChannel = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, {
			filename: 'again.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', positionId: tree.positionId, channel: 0
		});
		expect(sameChannel.status).toBe(409);
		expect((await sameChannel.json()).duplicateOf).toBe(first.captureId);
	}, 60_000);
});
