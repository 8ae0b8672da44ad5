// The JSON shape of a capture for the browser: its state, and — once analysed — the headline
// numbers and quality warnings. Object keys stay on the server.
import type { Knex } from 'knex';
import type { CaptureView } from '../../types/captures';
import { listCapturesWithSummaries, type AnalysisSummary, type CaptureRow } from '../queries/captures';

export type { CaptureView };

export function toView(c: CaptureRow, summary?: AnalysisSummary): CaptureView {
	const broadband = summary?.metrics.broadband as Record<string, number | null> | undefined;
	return {
		id: c.id,
		positionId: c.positionId,
		positionLabel: c.positionLabel,
		kind: c.kind,
		filename: c.filename,
		sizeBytes: c.sizeBytes === null ? null : Number(c.sizeBytes),
		sampleRate: c.sampleRate,
		channels: c.channels,
		channel: c.channel,
		durationS: c.durationS,
		status: c.status,
		error: c.error,
		note: c.note ?? null,
		engineVersion: summary?.engineVersion ?? null,
		warnings: (summary?.warnings ?? []) as CaptureView['warnings'],
		headline: broadband
			? {
					t30S: broadband.t30S ?? null,
					t20S: broadband.t20S ?? null,
					edtS: broadband.edtS ?? null,
					c80Db: broadband.c80Db ?? null,
					peakToNoiseDb: (summary?.metrics.peakToNoiseDb as number | null) ?? null
				}
			: null,
		updatedAt: new Date(c.updatedAt).toISOString()
	};
}

export async function sessionCaptureViews(k: Knex, sessionId: number): Promise<CaptureView[]> {
	return (await listCapturesWithSummaries(k, sessionId)).map((r) => toView(r.capture, r.summary));
}
