// Benchmark: worker throughput on the throw-away test services. A batch of captures (3 s, 48 kHz
// impulse responses) is uploaded through presigned URLs and queued with no worker running; then
// one worker is started and timed, then a second batch with two workers. Throughput is counted
// from the first result to the last (so the workers' start-up is left out):
// (batch − 1) / (last − first). Prints captures per second and two workers against one.
// Usage: npx tsx scripts/bench-pipeline.ts [--count N]   (do not run it while `npm test` runs)
import { rmSync } from 'node:fs';
import { loadavg } from 'node:os';
import { createHash } from 'node:crypto';
import knex from 'knex';
import { dataDir, migrate, profileEnv, startServices, stopServices } from './stack';
import { startWorker } from './processes';
import { seedDemo } from './demo/seed';
import { loadConfig } from '../src/lib/server/config';
import { knexSettings } from '../src/lib/server/db';
import { encodeWav } from '../src/lib/analysis';
import { exponentialNoiseDecay } from '../src/lib/analysis/synthetic';

const countArgument = process.argv.indexOf('--count');
const COUNT = countArgument > 0 ? Number(process.argv[countArgument + 1]) : 24;
const load = () => loadavg().map((v) => v.toFixed(2)).join(' ');

rmSync(dataDir('test'), { recursive: true, force: true });
const env = profileEnv('test');
Object.assign(process.env, env);
const services = await startServices('test');
const { confirmUpload, createCapture } = await import('../src/lib/server/captures/service');
const workers: ReturnType<typeof startWorker>[] = [];
const k = knex(knexSettings(loadConfig(env)));
try {
	await migrate(env);
	const { organizationId } = await seedDemo(k);
	const session = await k('sessions').orderBy('id').first('id');
	const user = await k('users').where({ email: 'acoustician@fenwick-hale.test' }).first('id', 'email', 'name');
	const scope = { organizationId, projectId: null, role: 'acoustician' as const, user: { ...user, unitSystem: 'metric' as const } };

	const wavs = (batch: number) =>
		Array.from({ length: COUNT }, (_, i) => {
			const x = exponentialNoiseDecay({ t60S: 0.4 + 0.02 * i, durationS: 3, sampleRate: 48_000, onsetS: 0.01, noiseDbRePeak: -75, seed: 900 + 100 * batch + i });
			let peak = 0;
			for (const v of x) peak = Math.max(peak, Math.abs(v));
			return encodeWav(x.map((v) => (0.5 * v) / peak), 48_000, 24);
		});

	async function queue(batch: number): Promise<number[]> {
		const ids: number[] = [];
		for (const [i, wav] of wavs(batch).entries()) {
			const created = await createCapture(scope, session.id, {
				filename: `bench-${batch}-${i}.wav`,
				sizeBytes: wav.byteLength,
				sha256: createHash('sha256').update(wav).digest('hex'),
				kind: 'impulse',
				newPositionLabel: `B${batch}-${i}`,
				channel: 0
			});
			const put = await fetch(created.upload.url, { method: 'PUT', headers: created.upload.headers, body: wav as Uint8Array<ArrayBuffer> });
			if (!put.ok) throw new Error(`PUT failed: ${put.status}`);
			await confirmUpload(scope, created.capture.id);
			ids.push(created.capture.id);
		}
		return ids;
	}

	/** Starts `count` workers on the queued batch; seconds from the first result to the last. */
	async function run(ids: number[], count: number): Promise<{ seconds: number; failed: number }> {
		for (let i = 0; i < count; i++) workers.push(startWorker(env, true));
		let first = 0;
		for (;;) {
			const done = await k('captures').whereIn('id', ids).whereIn('status', ['analysed', 'failed']).count({ n: '*' }).first();
			const n = Number(done?.n);
			if (n >= 1 && first === 0) first = performance.now();
			if (n === ids.length) break;
			await new Promise((r) => setTimeout(r, 10));
		}
		const seconds = (performance.now() - first) / 1000;
		const failed = await k('captures').whereIn('id', ids).where('status', 'failed').count({ n: '*' }).first();
		while (workers.length) await workers.pop()!.stop();
		return { seconds, failed: Number(failed?.n) };
	}

	console.log(`captures per batch: ${COUNT} (3 s, 48 kHz, 24-bit, mono); load average at start ${load()} (1, 5, 15 min)`);
	const one = await run(await queue(1), 1);
	const oneRate = (COUNT - 1) / one.seconds;
	console.log(`one worker:   ${oneRate.toFixed(2)} captures/s (first → last result ${one.seconds.toFixed(2)} s, ${one.failed} failed; goal ≥ 10/s)`);
	const two = await run(await queue(2), 2);
	const twoRate = (COUNT - 1) / two.seconds;
	console.log(`two workers:  ${twoRate.toFixed(2)} captures/s (first → last result ${two.seconds.toFixed(2)} s, ${two.failed} failed)`);
	console.log(`two against one: ${(twoRate / oneRate).toFixed(2)}× (goal ≥ 1.7× on two cores); load average now ${load()}`);
} finally {
	await k.destroy();
	while (workers.length) await workers.pop()!.stop();
	await stopServices(services);
}
