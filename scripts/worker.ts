// The background worker: sends the e-mail outbox (and, as they are added, runs queued jobs).
// Stops gracefully on SIGTERM/SIGINT: it finishes what it holds, then exits.
import { hostname } from 'node:os';
import { config } from '../src/lib/server/config';
import { closeDb, db } from '../src/lib/server/db';
import { createTransport, deliverDueMail } from '../src/lib/server/mail';

const POLL_MS = Number(process.env.WORKER_POLL_MS ?? 500);
const workerId = `${hostname()}:${process.pid}`;

let stopping = false;
const wake: { fn: (() => void) | null } = { fn: null };
for (const sig of ['SIGTERM', 'SIGINT'] as const) {
	process.on(sig, () => {
		stopping = true;
		wake.fn?.();
	});
}

async function main() {
	const k = db();
	const transport = createTransport();
	const from = config().MAIL_FROM;
	console.log(`[worker ${workerId}] started`);
	while (!stopping) {
		let did = 0;
		try {
			did += await deliverDueMail(k, transport, from);
		} catch (e) {
			console.error(`[worker ${workerId}]`, e);
		}
		if (did === 0 && !stopping) await new Promise<void>((r) => ((wake.fn = r), setTimeout(r, POLL_MS)));
	}
	transport.close();
	await closeDb();
	console.log(`[worker ${workerId}] stopped`);
}

main().catch((e) => {
	console.error(e);
	process.exit(1);
});
