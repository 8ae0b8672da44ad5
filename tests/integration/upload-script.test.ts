// scripts/upload.ts against the running test app: a batch of the fixtures goes into a visit with
// an API token and comes back byte for byte; a second run reports each file as a duplicate; a bad
// token, a partly bad batch, an all-bad batch and a wrong command line each end with their own
// exit status and leave nothing half made.
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { basename, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { testDb } from '../helpers/db';
import { BASE_URL } from '../helpers/env';
import { makeOrganization, makeProjectTree, makeUser, type ProjectTree } from '../helpers/factories';
import { makeApiToken, withToken } from '../helpers/api-tokens';

const ROOT = join(import.meta.dirname, '../..');
const FIXTURES = join(ROOT, 'fixtures');
const IMPULSES = ['decay-t0.5-48k.wav', 'living_room_1.wav', 'stereo-t0.3-t0.6-48k.wav'].map((f) => join(FIXTURES, f));
const RECORDED = join(FIXTURES, 'sweep-recorded-48k.wav');
const PLAYED = join(FIXTURES, 'sweep-1s-48k.wav');
const sha256 = (b: Uint8Array) => createHash('sha256').update(b).digest('hex');

interface Run {
	code: number | null;
	out: string;
}

function upload(args: string[], env: Record<string, string> = {}): Promise<Run> {
	return new Promise((resolve, reject) => {
		const child = spawn(process.execPath, ['--import', 'tsx', 'scripts/upload.ts', '--url', BASE_URL, ...args], {
			cwd: ROOT,
			env: { ...process.env, RINGDOWN_TOKEN: '', ...env },
			stdio: ['ignore', 'pipe', 'pipe']
		});
		let out = '';
		child.stdout.on('data', (c) => (out += c));
		child.stderr.on('data', (c) => (out += c));
		const timer = setTimeout(() => child.kill('SIGKILL'), 90_000);
		child.on('error', reject);
		child.on('close', (code) => {
			clearTimeout(timer);
			resolve({ code, out });
		});
	});
}

/** The summary table's row of a file: its cells. */
function row(out: string, file: string): string[] | undefined {
	const line = out.split('\n').find((l) => l.startsWith(`${file} `));
	return line?.split(/ {2,}/);
}

let k: Knex;
let tree: ProjectTree;
let uploadToken: string;
let readToken: string;
let dir: string;

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	tree = await makeProjectTree(k, org);
	const acoustician = await makeUser(k, org, 'acoustician');
	uploadToken = (await makeApiToken(k, acoustician.id, ['upload'])).token;
	readToken = (await makeApiToken(k, acoustician.id, ['read'])).token;
	dir = mkdtempSync(join(tmpdir(), 'ringdown-upload-'));
});
afterAll(async () => k.destroy());

const captures = () => k('captures').where({ session_id: tree.sessionId });

describe('scripts/upload.ts', () => {
	let uploaded: { file: string; id: number }[] = [];

	it('uploads a batch of impulse responses and a recorded sweep with its reference, and prints a summary', async () => {
		const first = await upload(['--visit', String(tree.sessionId), '--position', 'P1', ...IMPULSES], { RINGDOWN_TOKEN: uploadToken });
		expect(first.code, first.out).toBe(0);
		for (const [i, f] of IMPULSES.entries()) {
			expect(first.out).toMatch(new RegExp(`\\[${i + 1}/3\\] ${basename(f).replace('.', '\\.')}: uploaded as capture \\d+ \\(queued\\), position P1`));
			const cells = row(first.out, basename(f));
			expect(cells?.[2], first.out).toBe('uploaded');
			uploaded.push({ file: f, id: Number(cells![3]) });
		}
		expect(first.out).toContain('3 files: 3 uploaded, 0 already in the visit, 0 failed');

		// The token on the command line works too; a sweep goes with the sweep that was played.
		const sweep = await upload(['--visit', String(tree.sessionId), '--token', uploadToken, '--position', 'P2', '--kind', 'sweep', '--reference', PLAYED, RECORDED]);
		expect(sweep.code, sweep.out).toBe(0);
		const cells = row(sweep.out, basename(RECORDED));
		expect(cells?.[2], sweep.out).toBe('uploaded');
		uploaded.push({ file: RECORDED, id: Number(cells![3]) });
		const swept = await k('captures').where({ id: uploaded[3].id }).first();
		expect(swept.kind).toBe('sweep');
		expect(swept.reference_object_key).not.toBeNull();
		expect(await captures().count({ n: '*' }).first()).toEqual({ n: 4 });
	});

	it('round-trips the files: each one downloaded through the API is the file sent', async () => {
		expect(uploaded).toHaveLength(4);
		for (const { file, id } of uploaded) {
			const link = await withToken(readToken, 'GET', `/api/captures/${id}/download`);
			expect(link.status, file).toBe(302);
			const stored = new Uint8Array(await (await fetch(link.headers.get('location')!)).arrayBuffer());
			expect(sha256(stored), file).toBe(sha256(new Uint8Array(readFileSync(file))));
			const r = await k('captures as c').join('positions as p', 'p.id', 'c.position_id').where('c.id', id).first('c.original_filename', 'p.label', 'c.status');
			expect(r.original_filename).toBe(basename(file));
			expect(r.label).toBe(file === RECORDED ? 'P2' : 'P1');
			expect(r.status).not.toBe('awaiting_upload');
		}
	});

	it('reports every file of a second run as a duplicate of the capture it already is, and exits 0', async () => {
		const again = await upload(['--visit', String(tree.sessionId), '--position', 'P1', ...IMPULSES], { RINGDOWN_TOKEN: uploadToken });
		expect(again.code, again.out).toBe(0);
		for (const [i, f] of IMPULSES.entries()) {
			const cells = row(again.out, basename(f));
			expect(cells?.[2], again.out).toBe('duplicate');
			expect(Number(cells?.[3])).toBe(uploaded[i].id);
			expect(again.out).toMatch(new RegExp(`${basename(f).replace('.', '\\.')}: duplicate — This file is already in the visit`));
		}
		expect(again.out).toContain('3 files: 0 uploaded, 3 already in the visit, 0 failed');
		expect(await captures().count({ n: '*' }).first()).toEqual({ n: 4 });
	});

	it('a bad token: stops at the first file with the server’s reason, exit 4, nothing made', async () => {
		const before = await captures().count({ n: '*' }).first();
		const bad = await upload(['--visit', String(tree.sessionId), '--position', 'P9', join(FIXTURES, 'decay-t0.5-48k.wav'), join(FIXTURES, 'living_room_1.wav')], {
			RINGDOWN_TOKEN: `rdt_${'x'.repeat(43)}`
		});
		expect(bad.code, bad.out).toBe(4);
		expect(bad.out).toContain('failed — 401: This API token is not valid.');
		expect(row(bad.out, 'living_room_1.wav')?.[2]).toBe('not sent');
		expect(bad.out).toContain('The server refused the token or the visit');
		expect(await captures().count({ n: '*' }).first()).toEqual(before);
		expect(await k('positions').where({ session_id: tree.sessionId, label: 'P9' }).first()).toBeUndefined();
	});

	it('a token without the upload scope is refused the same way (403)', async () => {
		const res = await upload(['--visit', String(tree.sessionId), '--position', 'P9', join(FIXTURES, 'decay-t0.5-48k.wav')], { RINGDOWN_TOKEN: readToken });
		expect(res.code, res.out).toBe(4);
		expect(res.out).toContain('403: This API token’s scopes do not allow this.');
	});

	it('a partly bad batch: the good file goes, the bad one is reported with the reason, exit 1; all bad: exit 3', async () => {
		const broken = join(dir, 'broken.wav');
		writeFileSync(broken, Buffer.concat([Buffer.from('RIFF'), Buffer.alloc(200, 7)]));
		const good = join(dir, 'fresh.wav');
		// A file not yet in the visit: one of the fixtures with a byte changed past its header.
		const bytes = Buffer.from(readFileSync(join(FIXTURES, 'decay-t0.5-48k.wav')));
		bytes[bytes.length - 2] ^= 1;
		writeFileSync(good, bytes);
		const before = Number((await captures().count({ n: '*' }).first())?.n);
		const partly = await upload(['--visit', String(tree.sessionId), '--position-from-name', good, broken], { RINGDOWN_TOKEN: uploadToken });
		expect(partly.code, partly.out).toBe(1);
		expect(row(partly.out, 'fresh.wav')?.slice(2, 5)).toEqual(['uploaded', expect.stringMatching(/^\d+$/), 'fresh']);
		expect(row(partly.out, 'broken.wav')?.[2]).toBe('failed');
		expect(partly.out).toMatch(/broken\.wav: failed — 422: /);
		expect(Number((await captures().count({ n: '*' }).first())?.n)).toBe(before + 1);

		const allBad = await upload(['--visit', String(tree.sessionId), '--position', 'P1', broken], { RINGDOWN_TOKEN: uploadToken });
		expect(allBad.code, allBad.out).toBe(3);
		expect(Number((await captures().count({ n: '*' }).first())?.n)).toBe(before + 1);
	});

	it.each([
		['no visit', ['--position', 'P1', IMPULSES[0]], '--visit takes a whole number'],
		['no token', ['--visit', '1', '--position', 'P1', IMPULSES[0]], 'Give the API token'],
		['no position', ['--visit', '1', '--token', 'rdt_x', IMPULSES[0]], 'Say where the files were recorded'],
		['a sweep without what was played', ['--visit', '1', '--token', 'rdt_x', '--position', 'P1', '--kind', 'sweep', RECORDED], 'needs the sweep that was played'],
		['a missing file', ['--visit', '1', '--token', 'rdt_x', '--position', 'P1', 'no-such.wav'], 'no-such.wav cannot be read'],
		['an unknown option', ['--visit', '1', '--token', 'rdt_x', '--position', 'P1', '--colour', 'red', IMPULSES[0]], "Unknown option '--colour'"]
	])('a usage error (%s): exit 2, says what is wrong, sends nothing', async (_, args, message) => {
		const res = await upload(args);
		expect(res.code, res.out).toBe(2);
		expect(res.out).toContain(message);
		expect(res.out).toContain('Usage: npx tsx scripts/upload.ts');
	});
});
