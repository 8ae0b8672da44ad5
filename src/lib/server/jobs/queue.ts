// The job table as a queue. Workers claim with SELECT … FOR UPDATE SKIP LOCKED, so several of
// them — on one machine or many — share it without taking the same job. A claim is a lease:
// a worker that dies leaves its job to be claimed again once the lease runs out.
import type { Knex } from 'knex';
import { readJson } from '../json-column';

export type JobType = 'analyse-capture';

export interface Job<P = unknown> {
	id: number;
	type: JobType;
	payload: P;
	attempts: number;
	maxAttempts: number;
	leaseOwner: string;
}

export const DEFAULT_LEASE_MS = 60_000;

/** Retry back-off: 2 s, 4 s, 8 s … capped at 5 minutes. */
export function retryDelayMs(attempts: number): number {
	return Math.min(300_000, 2_000 * 2 ** Math.max(0, attempts - 1));
}

export async function enqueue(
	k: Knex,
	type: JobType,
	payload: Record<string, unknown>,
	options: { maxAttempts?: number; runAfter?: Date } = {}
): Promise<number> {
	const [id] = await k('jobs').insert({
		type,
		payload: JSON.stringify(payload),
		max_attempts: options.maxAttempts ?? 5,
		run_after: options.runAfter ?? k.raw('CURRENT_TIMESTAMP(3)')
	});
	return id;
}

/** Drop the jobs of a capture that have not finished (it is being deleted). */
export async function cancelCaptureJobs(k: Knex, type: JobType, captureId: number): Promise<void> {
	await k('jobs').where('type', type).whereIn('status', ['queued', 'running']).whereRaw("JSON_VALUE(payload, '$.captureId') = ?", [captureId]).del();
}

/** Called inside the claim's transaction when a job is dead-lettered there, to settle what it was for. */
export type OnExhausted = (trx: Knex.Transaction, job: Job, reason: string) => Promise<void>;

/** Why a job whose every attempt was used up without settling it is given up. */
export function exhaustedReason(attempts: number, lastError: string | null): string {
	const why = `it was tried ${attempts} time${attempts === 1 ? '' : 's'} and the last try stopped before finishing, which a file too long or too large to analyse here can cause`;
	return lastError ? `${why}; an earlier try said: ${lastError}` : why;
}

/**
 * Claim one due job: queued and due, or running with an expired lease (its worker died).
 * The attempt is counted in the statement that takes the lease, so a worker killed mid-job has
 * used one. A job found with every attempt used (its worker died on the last one) is not run
 * again: it is dead-lettered — status `dead`, the reason in `last_error` — and `onExhausted`
 * settles what it was for, in the same transaction. Returns null when there is nothing to do.
 */
export async function claim(k: Knex, owner: string, leaseMs = DEFAULT_LEASE_MS, onExhausted?: OnExhausted): Promise<Job | null> {
	for (let round = 0; round < 50; round++) {
		const outcome = await k.transaction(async (trx): Promise<Job | null | 'dead-lettered'> => {
			const row = await trx('jobs')
				.where((q) =>
					q
						.where((d) => d.where('status', 'queued').where('run_after', '<=', trx.raw('CURRENT_TIMESTAMP(3)')))
						.orWhere((e) => e.where('status', 'running').where('lease_expires_at', '<', trx.raw('CURRENT_TIMESTAMP(3)')))
				)
				.orderBy('run_after')
				.orderBy('id')
				.forUpdate()
				.skipLocked()
				.first();
			if (!row) return null;
			const job = (attempts: number): Job => ({
				id: row.id,
				type: row.type,
				payload: readJson(row.payload),
				attempts,
				maxAttempts: row.max_attempts,
				leaseOwner: owner
			});
			if (row.attempts >= row.max_attempts) {
				const reason = exhaustedReason(row.attempts, row.last_error);
				await trx('jobs')
					.where({ id: row.id })
					.update({ status: 'dead', last_error: reason.slice(0, 4000), lease_owner: null, lease_expires_at: null, finished_at: trx.raw('CURRENT_TIMESTAMP(3)') });
				await onExhausted?.(trx, job(row.attempts), reason);
				return 'dead-lettered';
			}
			await trx('jobs')
				.where({ id: row.id })
				.update({
					status: 'running',
					attempts: trx.raw('attempts + 1'),
					lease_owner: owner,
					lease_expires_at: trx.raw('CURRENT_TIMESTAMP(3) + INTERVAL ? MICROSECOND', [leaseMs * 1000])
				});
			return job(row.attempts + 1);
		});
		if (outcome !== 'dead-lettered') return outcome;
	}
	return null;
}

/** Extend the lease while working; false if the job is no longer ours. */
export async function renewLease(k: Knex, job: Job, leaseMs = DEFAULT_LEASE_MS): Promise<boolean> {
	const n = await k('jobs')
		.where({ id: job.id, status: 'running', lease_owner: job.leaseOwner })
		.update({ lease_expires_at: k.raw('CURRENT_TIMESTAMP(3) + INTERVAL ? MICROSECOND', [leaseMs * 1000]) });
	return n === 1;
}

export class LeaseLostError extends Error {
	constructor(jobId: number) {
		super(`Job ${jobId} is no longer held by this worker`);
		this.name = 'LeaseLostError';
	}
}

/**
 * Mark the job done inside the caller's transaction — the same one that writes its result —
 * and only if this worker still holds it. Throws LeaseLostError otherwise, which rolls the
 * result back: a job's result is written exactly once.
 */
export async function completeInTransaction(trx: Knex.Transaction, job: Job): Promise<void> {
	const held = await trx('jobs').where({ id: job.id, status: 'running', lease_owner: job.leaseOwner }).forUpdate().first('id');
	if (!held) throw new LeaseLostError(job.id);
	await trx('jobs').where({ id: job.id }).update({ status: 'done', finished_at: trx.raw('CURRENT_TIMESTAMP(3)'), lease_owner: null, lease_expires_at: null, last_error: null });
}

/**
 * A failed attempt: retry later with back-off, or mark the job dead at the limit. 'lease-lost'
 * when another worker holds the job by now (it is theirs to settle).
 */
export async function failAttempt(k: Knex, job: Job, reason: string, options: { permanent?: boolean } = {}): Promise<'retry' | 'dead' | 'lease-lost'> {
	const dead = options.permanent || job.attempts >= job.maxAttempts;
	const n = await k('jobs')
		.where({ id: job.id, status: 'running', lease_owner: job.leaseOwner })
		.update({
			status: dead ? 'dead' : 'queued',
			last_error: reason.slice(0, 4000),
			lease_owner: null,
			lease_expires_at: null,
			finished_at: dead ? k.raw('CURRENT_TIMESTAMP(3)') : null,
			run_after: dead ? k.raw('CURRENT_TIMESTAMP(3)') : new Date(Date.now() + retryDelayMs(job.attempts))
		});
	if (n !== 1) return 'lease-lost';
	return dead ? 'dead' : 'retry';
}

/** Hand a job back untouched (graceful stop before it could finish). */
export async function release(k: Knex, job: Job): Promise<void> {
	await k('jobs')
		.where({ id: job.id, lease_owner: job.leaseOwner, status: 'running' })
		.update({ status: 'queued', attempts: Math.max(0, job.attempts - 1), lease_owner: null, lease_expires_at: null, run_after: k.raw('CURRENT_TIMESTAMP(3)') });
}
