// A consultant's work on a room: comparisons of two visits, problem bands, advice, publishing.
import type { Knex } from 'knex';
import { recordAudit } from './audit';
import { config } from './config';
import { enqueueMail } from './mail';
import { reportPublishedMail } from './messages';
import { transaction } from './transaction';
import { Problem } from './problem';
import { createComparison, createProblemBand } from './queries/reviews';
import type { Scope } from './auth/access';


export async function startComparison(k: Knex, scope: Scope, roomId: number, input: { baselineSessionId: number; treatedSessionId: number; title: string }): Promise<number> {
	const sessions = await k('sessions').whereIn('id', [input.baselineSessionId, input.treatedSessionId]).select('id', 'room_id');
	if (sessions.length !== 2 || sessions.some((s) => s.room_id !== roomId)) {
		throw new Problem(400, 'Both visits must be of this room: a comparison across rooms would compare different spaces.', { field: 'treatedSessionId' });
	}
	return transaction(async (trx) => {
		const id = await createComparison(trx, { roomId, ...input, createdBy: scope.user.id });
		await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'comparison.created', entityType: 'comparison', entityId: id });
		return id;
	});
}

export async function addProblemBand(
	scope: Scope,
	roomId: number,
	input: { fLoHz: number; fHiHz: number; tLoMs: number | null; tHiMs: number | null; severity: string; note: string; comparisonId: number | null }
): Promise<number> {
	return transaction(async (trx) => {
		if (input.comparisonId !== null) {
			const c = await trx('comparisons').where({ id: input.comparisonId, room_id: roomId }).first('id');
			if (!c) throw new Problem(400, 'That comparison is of another room.', { field: 'comparisonId' });
		}
		const id = await createProblemBand(trx, roomId, { ...input, authorId: scope.user.id });
		await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'problem_band.created', entityType: 'problem_band', entityId: id, details: { fLoHz: input.fLoHz, fHiHz: input.fHiHz, severity: input.severity } });
		return id;
	});
}

export async function setProblemBandStatus(scope: Scope, id: number, status: 'open' | 'addressed'): Promise<void> {
	await transaction(async (trx) => {
		await trx('problem_bands').where({ id }).update({ status });
		await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: `problem_band.${status}`, entityType: 'problem_band', entityId: id });
	});
}

export async function removeProblemBand(scope: Scope, id: number): Promise<void> {
	await transaction(async (trx) => {
		await trx('problem_bands').where({ id }).del();
		await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'problem_band.deleted', entityType: 'problem_band', entityId: id });
	});
}

export async function saveAdvice(scope: Scope, comparisonId: number, advice: string, shareQualityNotes: boolean): Promise<void> {
	await transaction(async (trx) => {
		await trx('comparisons').where({ id: comparisonId }).update({ advice, share_quality_notes: shareQualityNotes });
		await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'comparison.advice_saved', entityType: 'comparison', entityId: comparisonId });
	});
}

/** Publish the report: from now on the project's clients see it, and each gets an e-mail. */
export async function publishReport(scope: Scope, comparisonId: number): Promise<{ notified: number }> {
	return transaction(async (trx) => {
		const c = await trx('comparisons as cm')
			.join('rooms as r', 'r.id', 'cm.room_id')
			.join('projects as p', 'p.id', 'r.project_id')
			.where('cm.id', comparisonId)
			.forUpdate()
			.first('cm.id', 'cm.title', 'cm.published_at', 'r.name as room_name', 'p.id as project_id', 'p.name as project_name');
		if (c.published_at) return { notified: 0 }; // already published: no second round of mail
		await trx('comparisons').where({ id: comparisonId }).update({ published_at: trx.raw('CURRENT_TIMESTAMP(3)'), published_by: scope.user.id });
		const clients = await trx('project_members as pm').join('users as u', 'u.id', 'pm.user_id').where('pm.project_id', c.project_id).select('u.email', 'u.name');
		for (const client of clients) {
			const mail = reportPublishedMail({ clientName: client.name, roomName: c.room_name, title: c.title, link: `${config().PUBLIC_BASE_URL}/reports/${comparisonId}` });
			await enqueueMail(trx, { to: client.email, kind: 'report-published', ...mail });
		}
		await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'comparison.published', entityType: 'comparison', entityId: comparisonId, details: { notified: clients.length } });
		return { notified: clients.length };
	});
}
