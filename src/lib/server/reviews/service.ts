// A consultant's work on a room: comparisons of two visits, problem bands, advice, publishing.
// Each change runs in one transaction with its audit record (and, on publishing, its mail).
import type { Knex } from 'knex';
import type { z } from 'zod';
import { audit } from '../audit';
import { config } from '../config';
import { db } from '../db';
import { enqueueMail } from '../mail';
import { reportPublishedMail } from '../messages';
import { invalid, notFound } from '../problem';
import { transaction } from '../transaction';
import type { Scope } from '../auth/access';
import { listProjectClients } from '../queries/projects';
import {
	createComparison,
	createProblemBand,
	deleteProblemBand,
	getComparison,
	isComparisonOfRoom,
	isProblemBandOfRoom,
	lockComparisonToPublish,
	markPublished,
	saveComparisonAdvice,
	updateProblemBandStatus
} from '../queries/reviews';
import { areVisitsOfRoom } from '../queries/rooms';
import type { adviceSchema, comparisonSchema, problemBandSchema } from '../../schemas/reviews';

type ComparisonInput = z.output<typeof comparisonSchema>;
type ProblemBandInput = z.output<typeof problemBandSchema>;
type AdviceInput = z.output<typeof adviceSchema>;

export async function startComparison(scope: Scope, roomId: number, input: ComparisonInput): Promise<number> {
	return transaction(async (trx) => {
		if (!(await areVisitsOfRoom(trx, roomId, [input.baselineSessionId, input.treatedSessionId]))) {
			throw invalid('Both visits must be of this room: a comparison across rooms would compare different spaces.', 'treatedSessionId');
		}
		const id = await createComparison(trx, { roomId, ...input, createdBy: scope.user.id });
		await audit(trx, scope, 'comparison.created', 'comparison', id);
		return id;
	});
}

export async function addProblemBand(scope: Scope, roomId: number, input: ProblemBandInput): Promise<number> {
	return transaction(async (trx) => {
		if (input.comparisonId !== null && !(await isComparisonOfRoom(trx, input.comparisonId, roomId))) {
			throw invalid('That comparison is of another room.', 'comparisonId');
		}
		const id = await createProblemBand(trx, roomId, { ...input, authorId: scope.user.id });
		await audit(trx, scope, 'problem_band.created', 'problem_band', id, { fLoHz: input.fLoHz, fHiHz: input.fHiHz, severity: input.severity });
		return id;
	});
}

/** A problem band marked on a comparison's chart: it belongs to the comparison's room. */
export async function addProblemBandOfComparison(scope: Scope, comparisonId: number, input: ProblemBandInput): Promise<number> {
	const comparison = (await getComparison(db(), comparisonId))!;
	return addProblemBand(scope, comparison.roomId, { ...input, comparisonId });
}

async function checkBandOfRoom(trx: Knex, roomId: number, bandId: number): Promise<void> {
	if (!(await isProblemBandOfRoom(trx, bandId, roomId))) throw notFound('No such problem band in this room.');
}

export async function setProblemBandStatus(scope: Scope, roomId: number, bandId: number, status: 'open' | 'addressed'): Promise<void> {
	await transaction(async (trx) => {
		await checkBandOfRoom(trx, roomId, bandId);
		await updateProblemBandStatus(trx, bandId, status);
		await audit(trx, scope, `problem_band.${status}`, 'problem_band', bandId);
	});
}

export async function removeProblemBand(scope: Scope, roomId: number, bandId: number): Promise<void> {
	await transaction(async (trx) => {
		await checkBandOfRoom(trx, roomId, bandId);
		await deleteProblemBand(trx, bandId);
		await audit(trx, scope, 'problem_band.deleted', 'problem_band', bandId);
	});
}

export async function saveAdvice(scope: Scope, comparisonId: number, input: AdviceInput): Promise<void> {
	await transaction(async (trx) => {
		await saveComparisonAdvice(trx, comparisonId, input.advice, input.shareQualityNotes);
		await audit(trx, scope, 'comparison.advice_saved', 'comparison', comparisonId);
	});
}

/** Publish the report: from now on the project's clients see it, and each gets an e-mail. */
export async function publishReport(scope: Scope, comparisonId: number): Promise<{ notified: number }> {
	return transaction(async (trx) => {
		const c = (await lockComparisonToPublish(trx, comparisonId))!;
		if (c.publishedAt) return { notified: 0 }; // already published: no second round of mail
		await markPublished(trx, comparisonId, scope.user.id);
		const clients = await listProjectClients(trx, c.projectId);
		for (const client of clients) {
			const mail = reportPublishedMail({ clientName: client.name, roomName: c.roomName, title: c.title, link: `${config().PUBLIC_BASE_URL}/reports/${comparisonId}` });
			await enqueueMail(trx, { to: client.email, kind: 'report-published', ...mail });
		}
		await audit(trx, scope, 'comparison.published', 'comparison', comparisonId, { notified: clients.length });
		return { notified: clients.length };
	});
}
