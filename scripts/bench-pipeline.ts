// Benchmark: 24 captures (3 s, 48 kHz impulse responses) uploaded through presigned URLs and
// analysed by one worker, on the throw-away test services. Prints captures per second and the
// time from the last upload to the last result. Usage: npx tsx scripts/bench-pipeline.ts
import { rmSync } from 'node:fs';
import knex from 'knex';
import { dataDir, migrate, profileEnv, startServices, stopServices } from './stack';
import { startWorker } from './processes';
import { seedDemo } from './demo/seed';
import { loadConfig } from '../src/lib/server/config';
import { knexSettings } from '../src/lib/server/db';
import { encodeWav } from '../src/lib/analysis';
import { exponentialNoiseDecay } from '../src/lib/analysis/synthetic';
import { createHash } from 'node:crypto';

const COUNT = 24;
rmSync(dataDir('test'), { recursive: true, force: true });
const env = profileEnv('test');
Object.assign(process.env, env);
const services = await startServices('test');
const { confirmUpload, createCapture } = await import('../src/lib/server/captures/service');
let worker: ReturnType<typeof startWorker> | undefined;
const k = knex(knexSettings(loadConfig(env)));
try {
	await migrate(env);
	const { organizationId } = await seedDemo(k);
	const session = await k('sessions').orderBy('id').first('id');
	const user = await k('users').where({ email: 'acoustician@fenwick-hale.test' }).first('id', 'email', 'name');
	const scope = { organizationId, projectId: null, role: 'acoustician' as const, user: { ...user, unitSystem: 'metric' as const } };

	worker = startWorker(env, true);
	const files = Array.from({ length: COUNT }, (_, i) => {
		const x = exponentialNoiseDecay({ t60S: 0.4 + 0.02 * i, durationS: 3, sampleRate: 48_000, onsetS: 0.01, noiseDbRePeak: -75, seed: 900 + i });
		let peak = 0;
		for (const v of x) peak = Math.max(peak, Math.abs(v));
		return encodeWav(x.map((v) => (0.5 * v) / peak), 48_000, 24);
	});

	const t0 = performance.now();
	const ids: number[] = [];
	for (const [i, wav] of files.entries()) {
		const created = await createCapture(scope, session.id, {
			filename: `bench-${i}.wav`, sizeBytes: wav.byteLength, sha256: createHash('sha256').update(wav).digest('hex'), kind: 'impulse', newPositionLabel: `B${i}`, channel: 0
		});
		const put = await fetch(created.upload.url, { method: 'PUT', headers: created.upload.headers, body: wav as Uint8Array<ArrayBuffer> });
		if (!put.ok) throw new Error(`PUT failed: ${put.status}`);
		await confirmUpload(scope, created.capture.id);
		ids.push(created.capture.id);
	}
	const lastUpload = performance.now();
	for (;;) {
		const done = await k('captures').whereIn('id', ids).whereIn('status', ['analysed', 'failed']).count({ n: '*' }).first();
		if (Number(done?.n) === COUNT) break;
		await new Promise((r) => setTimeout(r, 20));
	}
	const end = performance.now();
	const failed = await k('captures').whereIn('id', ids).where('status', 'failed').count({ n: '*' }).first();
	console.log(`captures:                      ${COUNT} (3 s, 48 kHz, 24-bit, mono), ${Number(failed?.n)} failed`);
	console.log(`upload phase:                  ${((lastUpload - t0) / 1000).toFixed(2)} s`);
	console.log(`last upload → last result:     ${((end - lastUpload) / 1000).toFixed(2)} s   (target: under 15 s)`);
	console.log(`first upload → last result:    ${((end - t0) / 1000).toFixed(2)} s`);
	console.log(`throughput:                    ${(COUNT / ((end - t0) / 1000)).toFixed(2)} captures/s with one worker`);
} finally {
	await k.destroy();
	await worker?.stop();
	await stopServices(services);
}
