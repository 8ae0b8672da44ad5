// Runs claimed jobs: one at a time per worker, the lease renewed while it works, failures
// retried with back-off until the job's attempt limit, then settled as dead with the reason.
import type { Knex } from 'knex';
import type { Storage } from '../storage';
import { claim, DEFAULT_LEASE_MS, failAttempt, LeaseLostError, renewLease, type Job } from './queue';
import { transaction } from '../transaction';
import { handleAnalyseCapture, settleDeadAnalysis, type AnalyseCapturePayload } from './analyse-capture';

export interface RunnerOptions {
	owner: string;
	leaseMs?: number;
	log?: (message: string) => void;
}

export type RunOutcome = { job: Job; result: string } | null;

async function handle(k: Knex, s: Storage, job: Job): Promise<string> {
	switch (job.type) {
		case 'analyse-capture':
			return handleAnalyseCapture(k, s, job as Job<AnalyseCapturePayload>);
		default:
			throw new Error(`No handler for job type ${job.type}`);
	}
}

/** Settle what a dead job was for (its capture fails with the reason), inside the caller's transaction. */
async function settleDead(trx: Knex.Transaction, job: Job, reason: string): Promise<void> {
	if (job.type === 'analyse-capture') await settleDeadAnalysis(trx, job as Job<AnalyseCapturePayload>, reason);
}

/** Claim and run one job. Null when none was due. */
export async function runNextJob(k: Knex, s: Storage, o: RunnerOptions): Promise<RunOutcome> {
	const leaseMs = o.leaseMs ?? DEFAULT_LEASE_MS;
	const job = await claim(k, o.owner, leaseMs, async (trx, dead, reason) => {
		await settleDead(trx, dead, reason);
		o.log?.(`job ${dead.id} (${dead.type}) dead-lettered after ${dead.attempts} attempts: ${reason}`);
	});
	if (!job) return null;
	const renew = setInterval(() => void renewLease(k, job, leaseMs).catch(() => {}), Math.max(250, leaseMs / 3));
	try {
		const result = await handle(k, s, job);
		return { job, result };
	} catch (e) {
		if (e instanceof LeaseLostError) return { job, result: 'lease-lost' };
		const reason = e instanceof Error ? e.message : String(e);
		// The verdict and, for a dead job, its capture's failure in one transaction: a worker that
		// stops between the two cannot leave a dead job beside a capture still waiting for it.
		const verdict = await transaction(async (trx) => {
			const v = await failAttempt(trx, job, reason);
			if (v === 'dead') await settleDead(trx, job, reason);
			return v;
		}, k);
		o.log?.(`job ${job.id} (${job.type}) attempt ${job.attempts} failed: ${reason}${verdict === 'dead' ? ' — giving up' : verdict === 'retry' ? ' — will retry' : ' — another worker holds it now'}`);
		return { job, result: verdict };
	} finally {
		clearInterval(renew);
	}
}
