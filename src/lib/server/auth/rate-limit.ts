import type { Knex } from 'knex';
import { countFailedSignIns } from '../queries/sign-ins';

// Failed sign-ins are limited per account and address, with a looser cap per address alone
// so one machine cannot walk through many accounts. (Limits: common practice, no source.)
export const SIGN_IN_LIMITS = {
	windowMinutes: 15,
	perAccountAndAddress: 10,
	perAddress: 100
} as const;

export interface RateVerdict {
	blocked: boolean;
	retryAfterMinutes: number;
}

export async function signInVerdict(k: Knex, email: string, ip: string, now = new Date()): Promise<RateVerdict> {
	const since = new Date(now.getTime() - SIGN_IN_LIMITS.windowMinutes * 60_000);
	const [pair, address] = await Promise.all([countFailedSignIns(k, { ip, email }, since), countFailedSignIns(k, { ip }, since)]);
	const over = pair.count >= SIGN_IN_LIMITS.perAccountAndAddress ? pair : address.count >= SIGN_IN_LIMITS.perAddress ? address : null;
	if (!over || !over.first) return { blocked: false, retryAfterMinutes: 0 };
	const freeAt = over.first.getTime() + SIGN_IN_LIMITS.windowMinutes * 60_000;
	return { blocked: true, retryAfterMinutes: Math.max(1, Math.ceil((freeAt - now.getTime()) / 60_000)) };
}
