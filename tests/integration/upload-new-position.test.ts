// An upload may name a new position ("P4"): the position is made with the capture, in its
// transaction. If that upload never arrives — its file is refused at confirm, the browser takes
// it back after a failed PUT, or it is abandoned and swept a day later — the position goes with
// it, unless something else has kept it: another capture, a capture of it that arrived, or a
// person's edit. A refused announcement leaves no position at all.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { makeOrganization, type ProjectTree } from '../helpers/factories';
import { acousticianWithProject, type Client } from '../helpers/http';
import { decayWav, sha256 } from '../helpers/wav';
import { createStorage } from '../../src/lib/server/storage';
import { loadConfig } from '../../src/lib/server/config';
import { removeAbandonedUploads } from '../../src/lib/server/captures/service';
import { readJson } from '../../src/lib/server/json-column';

let k: Knex;
let tree: ProjectTree;
let acoustician: Client;
const s3 = createStorage(loadConfig(process.env));
let seed = 7100;

interface Announced {
	capture: { id: number };
	upload: { url: string; headers: Record<string, string> };
}

async function announce(into: { newPositionLabel: string } | { positionId: number }, wav = decayWav({ seed: seed++, durationS: 0.4 }), extra: Record<string, unknown> = {}) {
	const res = await acoustician.postJson(`/api/sessions/${tree.sessionId}/captures`, {
		filename: 'new-position.wav', sizeBytes: wav.byteLength, sha256: sha256(wav), kind: 'impulse', ...into, ...extra
	});
	return { res, wav };
}

async function announced(into: { newPositionLabel: string } | { positionId: number }, wav?: Uint8Array) {
	const { res, wav: sent } = await announce(into, wav);
	expect(res.status, await res.clone().text()).toBe(201);
	return { ...((await res.json()) as Announced), wav: sent };
}

const put = (a: Announced, body: Uint8Array) => fetch(a.upload.url, { method: 'PUT', headers: a.upload.headers, body: body as Uint8Array<ArrayBuffer> });
const confirm = (id: number) => acoustician.request('POST', `/api/captures/${id}/uploaded`, { headers: { accept: 'application/json' } });
const withdraw = (id: number) => acoustician.request('DELETE', `/api/captures/${id}`, { headers: { accept: 'application/json' } });
const positionNamed = (label: string) => k('positions').where({ session_id: tree.sessionId, label }).first();
const captureRow = (id: number) => k('captures').where({ id }).first();

beforeAll(async () => {
	k = testDb();
	({ tree, acoustician } = await acousticianWithProject(k));
});
afterAll(async () => k.destroy());

describe('a new position named by an upload that does not arrive', () => {
	it('is removed with a file refused at confirm (not a WAV), and both removals are audited', async () => {
		const notWav = new Uint8Array(2000).fill(7);
		const a = await announced({ newPositionLabel: 'N1' }, notWav);
		const made = await positionNamed('N1');
		expect(made).toBeDefined(); // made with the capture, in its transaction
		expect(await k('audit_events').where({ entity_type: 'position', entity_id: made.id, action: 'position.created' }).first()).toBeDefined();
		expect((await put(a, notWav)).status).toBe(200);

		const res = await confirm(a.capture.id);
		expect(res.status).toBe(422);
		expect(await captureRow(a.capture.id)).toBeUndefined();
		expect(await positionNamed('N1')).toBeUndefined();
		const removal = await k('audit_events').where({ entity_type: 'position', entity_id: made.id, action: 'position.deleted' }).first();
		expect(readJson(removal.details)).toMatchObject({ label: 'N1', withCapture: a.capture.id });
	});

	it('is removed when the browser takes the capture back after its PUT failed', async () => {
		const a = await announced({ newPositionLabel: 'N2' });
		// The PUT never happened: confirming finds nothing (409, the capture is kept for a retry)…
		expect((await confirm(a.capture.id)).status).toBe(409);
		expect(await positionNamed('N2')).toBeDefined();
		// …so the page withdraws it, and the position made for it goes too.
		expect((await withdraw(a.capture.id)).status).toBe(204);
		expect(await captureRow(a.capture.id)).toBeUndefined();
		expect(await positionNamed('N2')).toBeUndefined();

		// Sending the same file again works (no duplicate of a capture that never arrived) and makes it anew.
		const again = await announced({ newPositionLabel: 'N2' }, a.wav);
		expect((await put(again, again.wav)).status).toBe(200);
		expect((await confirm(again.capture.id)).status).toBe(200);
		expect(await positionNamed('N2')).toMatchObject({ made_by_upload: 0 });
	});

	it('is removed by the sweep of uploads abandoned for a day', async () => {
		const a = await announced({ newPositionLabel: 'N3' });
		await k('captures').where({ id: a.capture.id }).update({ created_at: k.raw('NOW() - INTERVAL 2 DAY') });
		expect(await removeAbandonedUploads(k, 24, s3)).toBeGreaterThanOrEqual(1);
		expect(await captureRow(a.capture.id)).toBeUndefined();
		expect(await positionNamed('N3')).toBeUndefined();
		expect(await k('audit_events').where({ action: 'capture.abandoned', entity_id: a.capture.id }).first()).toBeDefined();
	});

	it('stays while another upload of the batch still holds it, and goes with the last one', async () => {
		const first = await announced({ newPositionLabel: 'N4' });
		const second = await announced({ newPositionLabel: 'N4' }); // the same new label: the same position
		expect((await k('captures').whereIn('id', [first.capture.id, second.capture.id]).distinct('position_id')).length).toBe(1);
		expect((await withdraw(first.capture.id)).status).toBe(204);
		expect(await positionNamed('N4')).toBeDefined();
		expect((await withdraw(second.capture.id)).status).toBe(204);
		expect(await positionNamed('N4')).toBeUndefined();
	});
});

describe('a position that is kept', () => {
	it('stays once a capture of it has arrived, even after a later upload into it is withdrawn or the arrived one deleted', async () => {
		const a = await announced({ newPositionLabel: 'K1' });
		expect((await put(a, a.wav)).status).toBe(200);
		expect((await confirm(a.capture.id)).status).toBe(200);
		const kept = await positionNamed('K1');
		const later = await announced({ positionId: kept.id });
		expect((await withdraw(later.capture.id)).status).toBe(204);
		expect(await positionNamed('K1')).toBeDefined();
		// Deleting the arrived capture is a person's choice about that capture, not about the position.
		expect((await withdraw(a.capture.id)).status).toBe(204);
		expect(await positionNamed('K1')).toBeDefined();
	});

	it('stays when a person edited it while its upload was on its way', async () => {
		const a = await announced({ newPositionLabel: 'K2' });
		const made = await positionNamed('K2');
		const edit = await acoustician.postForm(`/sessions/${tree.sessionId}?/updatePosition`, { positionId: String(made.id), label: 'K2 sofa', micX: '2', micY: '1.5', micZ: '1.2' });
		expect(edit.status).toBe(200);
		expect((await withdraw(a.capture.id)).status).toBe(204);
		expect(await positionNamed('K2 sofa')).toBeDefined();
	});

	it('stays when it was made by a person, whatever happens to an upload into it', async () => {
		const [id] = await k('positions').insert({ session_id: tree.sessionId, label: 'K3' }); // as the position form makes it
		const notWav = new Uint8Array(1500).fill(3);
		const a = await announced({ positionId: id }, notWav);
		expect((await put(a, notWav)).status).toBe(200);
		expect((await confirm(a.capture.id)).status).toBe(422);
		expect(await k('positions').where({ id }).first()).toBeDefined();
		// The factory's own position stays through a withdrawn upload too.
		const b = await announced({ positionId: tree.positionId });
		expect((await withdraw(b.capture.id)).status).toBe(204);
		expect(await k('positions').where({ id: tree.positionId }).first()).toBeDefined();
	});
});

describe('an announcement that is refused', () => {
	it('makes no position: a test signal of another practice, a duplicate file, two at once of one file', async () => {
		const otherOrg = await makeOrganization(k);
		const [foreignSweep] = await k('sweep_definitions').insert({
			organization_id: otherOrg, name: 'theirs', sample_rate: 48000, f1_hz: 20, f2_hz: 20000, duration_s: 5, level_dbfs: -12, fade_in_s: 0.05, fade_out_s: 0.05, silence_s: 2, bit_depth: '24', object_key: `sweeps/${otherOrg}-theirs.wav`
		});
		const { res: foreign } = await announce({ newPositionLabel: 'R1' }, undefined, { kind: 'sweep', sweepDefinitionId: foreignSweep });
		expect(foreign.status).toBe(422);
		expect(await positionNamed('R1')).toBeUndefined();

		const kept = await announced({ positionId: tree.positionId });
		const { res: duplicate } = await announce({ newPositionLabel: 'R2' }, kept.wav);
		expect(duplicate.status).toBe(409);
		expect(await positionNamed('R2')).toBeUndefined();

		// The same new file at once into two new positions: one is taken, the other refused with no position left.
		const wav = decayWav({ seed: seed++, durationS: 0.4 });
		const [x, y] = await Promise.all([announce({ newPositionLabel: 'R3' }, wav), announce({ newPositionLabel: 'R4' }, wav)]);
		expect([x.res.status, y.res.status].sort()).toEqual([201, 409]);
		const made = (await k('positions').where({ session_id: tree.sessionId }).whereIn('label', ['R3', 'R4']).select('label')).map((r) => r.label);
		expect(made).toEqual([x.res.status === 201 ? 'R3' : 'R4']);
	});
});
