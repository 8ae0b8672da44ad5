// What pages and API routes read about captures: their views, stored results and files.
import { db } from '../db';
import { conflict, notFound } from '../problem';
import { storage, type Storage } from '../storage';
import { getAnalysis, getAnalysisMetrics, type StoredAnalysis, type StoredMetrics } from '../queries/analyses';
import { analysisSummaries, getCapture } from '../queries/captures';
import { getPosition } from '../queries/positions';
import { getProject } from '../queries/projects';
import { listProblemBands } from '../queries/reviews';
import { getRoom } from '../queries/rooms';
import { getSession } from '../queries/sessions';
import { isPendingStatus } from '../../captures/status';
import { sessionCaptureViews, toView, type CaptureView } from './views';

const NO_ANALYSIS = 'This capture has no analysis yet.';

/** One capture with its headline numbers and warnings. */
export async function captureView(captureId: number): Promise<CaptureView> {
	const k = db();
	const capture = (await getCapture(k, captureId))!;
	return toView(capture, (await analysisSummaries(k, [captureId])).get(captureId));
}

/** A visit's captures, and how many of them are still uploading, queued or being analysed. */
export async function sessionCaptures(sessionId: number): Promise<{ captures: CaptureView[]; pending: number }> {
	const captures = await sessionCaptureViews(db(), sessionId);
	return { captures, pending: captures.filter((c) => isPendingStatus(c.status)).length };
}

/** The whole stored result of a capture: metrics, warnings and chart curves. */
export async function storedAnalysis(captureId: number): Promise<StoredAnalysis> {
	const analysis = await getAnalysis(db(), captureId);
	if (!analysis) throw notFound(NO_ANALYSIS);
	return analysis;
}

/**
 * A capture's per-band metrics, with its file name to name the export after. A failed capture keeps
 * its numbers for the quality notes, but they are not exported as results.
 */
export async function captureMetrics(captureId: number): Promise<{ filename: string; note: string | null; metrics: StoredMetrics }> {
	const k = db();
	const capture = (await getCapture(k, captureId))!;
	if (capture.status === 'failed') throw conflict('This capture could not be analysed, so it has no band values to export; its page says why.', { code: 'capture_failed' });
	const metrics = await getAnalysisMetrics(k, captureId);
	if (!metrics) throw notFound(NO_ANALYSIS);
	return { filename: capture.filename, note: capture.note, metrics };
}

/** A short-lived link to the original file (the object key itself stays random and unseen). */
export async function originalFileLink(captureId: number, s: Storage = storage()): Promise<string> {
	const capture = (await getCapture(db(), captureId))!;
	return s.presignGet(capture.objectKey, capture.filename);
}

/** The capture page's shell; the charts' data comes from the analysis route in the browser. */
export async function capturePage(captureId: number) {
	const k = db();
	const capture = (await getCapture(k, captureId))!;
	const session = (await getSession(k, capture.sessionId))!;
	const room = (await getRoom(k, session.roomId))!;
	const [project, position, summaries, problemBands] = await Promise.all([
		getProject(k, room.projectId),
		getPosition(k, capture.positionId),
		analysisSummaries(k, [captureId]),
		listProblemBands(k, room.id)
	]);
	return {
		capture: toView(capture, summaries.get(captureId)),
		session: { id: session.id, conditionLabel: session.conditionLabel, measuredOn: session.measuredOn },
		room: { id: room.id, name: room.name, lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM, volumeM3: room.volumeM3, roomUse: room.roomUse },
		project: { id: project!.id, name: project!.name },
		positionHasCoordinates: Boolean(position?.source && position?.mic),
		problemBands
	};
}
