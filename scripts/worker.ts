// The background worker: runs queued jobs (capture analysis) and sends the e-mail outbox.
// Several workers, on one machine or many, share the job table. On SIGTERM/SIGINT it finishes
// the job it holds (analysis takes seconds), then exits; a worker that is killed leaves its
// job to be claimed again when the lease runs out.
import { hostname } from 'node:os';
import { config } from '../src/lib/server/config';
import { closeDb, db } from '../src/lib/server/db';
import { createTransport, deliverDueMail } from '../src/lib/server/mail';
import { createStorage } from '../src/lib/server/storage';
import { runNextJob } from '../src/lib/server/jobs/runner';
import { removeAbandonedUploads } from '../src/lib/server/captures/service';
import { removeOrphanObjects } from '../src/lib/server/housekeeping/orphan-objects';
import { warmUpEngine } from '../src/lib/server/jobs/warm-up';

const HOUSEKEEPING_MS = 10 * 60_000;

const { WORKER_POLL_MS: POLL_MS, JOB_LEASE_MS: LEASE_MS } = config();
const owner = `${hostname()}:${process.pid}`;
const log = (m: string) => console.log(`[worker ${owner}] ${m}`);

let stopping = false;
let wake: (() => void) | null = null;
for (const sig of ['SIGTERM', 'SIGINT'] as const) {
	process.on(sig, () => {
		stopping = true;
		wake?.();
	});
}

async function main() {
	const k = db();
	const s = createStorage();
	const transport = createTransport();
	const from = config().MAIL_FROM;
	log('started');
	// Before the first claim, so the first capture is analysed at the warm speed (see warm-up.ts).
	log(`engine warmed up (${warmUpEngine().cpuMs.toFixed(0)} ms CPU)`);
	let lastHousekeeping = 0;
	while (!stopping) {
		let busy = false;
		try {
			if (Date.now() - lastHousekeeping > HOUSEKEEPING_MS) {
				lastHousekeeping = Date.now();
				const removed = await removeAbandonedUploads(k, 24, s);
				if (removed) log(`removed ${removed} abandoned upload(s)`);
				const orphans = await removeOrphanObjects(k, s);
				if (orphans) log(`removed ${orphans} stored object(s) no record refers to`);
			}
			const outcome = await runNextJob(k, s, { owner, leaseMs: LEASE_MS, log });
			if (outcome) busy = true;
			if ((await deliverDueMail(k, transport, from)) > 0) busy = true;
		} catch (e) {
			log(`error: ${e instanceof Error ? e.message : e}`);
		}
		if (!busy && !stopping) await new Promise<void>((r) => ((wake = r), setTimeout(r, POLL_MS)));
	}
	transport.close();
	await closeDb();
	log('stopped');
}

main().catch((e) => {
	console.error(e);
	process.exit(1);
});
