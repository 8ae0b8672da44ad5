// Stored results of the engine, one row per capture: metrics for lists and tables, curves only
// for charts, warnings beside them.
import type { Knex } from 'knex';
import type { AnalysisCurves, AnalysisResult, AnalysisWarning } from '../../analysis/types';
import { readJson } from '../json-column';

export type StoredMetrics = Omit<AnalysisResult, 'curves' | 'warnings'>;

export interface StoredAnalysis {
	engineVersion: string;
	metrics: StoredMetrics;
	warnings: AnalysisWarning[];
	curves: AnalysisCurves;
}

export async function getAnalysis(k: Knex, captureId: number): Promise<StoredAnalysis | undefined> {
	const r = await k('analyses').where({ capture_id: captureId }).first('engine_version', 'metrics', 'warnings', 'curves');
	return r && { engineVersion: r.engine_version, metrics: readJson(r.metrics), warnings: readJson(r.warnings), curves: readJson(r.curves) };
}

export async function getAnalysisMetrics(k: Knex, captureId: number): Promise<StoredMetrics | undefined> {
	const r = await k('analyses').where({ capture_id: captureId }).first('metrics');
	return r && readJson(r.metrics);
}

/** Replace a capture's result with this one (none: the analysis failed). */
export async function replaceAnalysis(k: Knex, captureId: number, result: AnalysisResult | null): Promise<void> {
	await k('analyses').where({ capture_id: captureId }).del();
	if (!result) return;
	const { curves, warnings, ...metrics } = result;
	await k('analyses').insert({
		capture_id: captureId,
		engine_version: result.engineVersion,
		metrics: JSON.stringify(metrics),
		curves: JSON.stringify(curves),
		warnings: JSON.stringify(warnings)
	});
}

/** The analysed captures of a visit, newest first within each position label. */
export async function analysedCapturesOfSession(
	k: Knex,
	sessionId: number
): Promise<{ captureId: number; positionLabel: string; sourceLabel: string | null; micLabel: string | null; metrics: StoredMetrics; curves: AnalysisCurves }[]> {
	const rows = await k('captures as c')
		.join('positions as po', 'po.id', 'c.position_id')
		.join('analyses as a', 'a.capture_id', 'c.id')
		.where({ 'c.session_id': sessionId, 'c.status': 'analysed' })
		.orderBy('po.label')
		.orderBy('c.id', 'desc')
		.select('c.id', 'po.label', 'po.source_label', 'po.mic_label', 'a.metrics', 'a.curves');
	return rows.map((r) => ({
		captureId: r.id,
		positionLabel: r.label,
		sourceLabel: r.source_label ?? null,
		micLabel: r.mic_label ?? null,
		metrics: readJson(r.metrics),
		curves: readJson(r.curves)
	}));
}

export interface AnalysedCaptureRow {
	captureId: number;
	positionLabel: string;
	sourceLabel: string | null;
	micLabel: string | null;
	/** The stored result: a re-analysis replaces the row, so these change with it. */
	analysisId: number;
	engineVersion: string;
	analysedAt: string;
	/** Its quality warnings, where they were read with it. */
	warnings?: AnalysisWarning[];
}

/** The analysed captures of a visit without their stored JSON, newest first within each position label. */
export async function analysedCaptureRowsOfSession(k: Knex, sessionId: number): Promise<AnalysedCaptureRow[]> {
	return analysedCaptureRowsOfSessions(k, [sessionId]);
}

/** The same for several visits in one query, each row with its visit. */
export async function analysedCaptureRowsOfSessions(k: Knex, sessionIds: number[]): Promise<(AnalysedCaptureRow & { sessionId: number })[]> {
	if (sessionIds.length === 0) return [];
	const rows = await k('captures as c')
		.join('positions as po', 'po.id', 'c.position_id')
		.join('analyses as a', 'a.capture_id', 'c.id')
		.whereIn('c.session_id', sessionIds)
		.where('c.status', 'analysed')
		.orderBy('po.label')
		.orderBy('c.id', 'desc')
		.select('c.id', 'c.session_id', 'po.label', 'po.source_label', 'po.mic_label', 'a.id as analysis_id', 'a.engine_version', 'a.created_at', 'a.warnings');
	return rows.map((r) => ({
		sessionId: r.session_id,
		captureId: r.id,
		positionLabel: r.label,
		sourceLabel: r.source_label ?? null,
		micLabel: r.mic_label ?? null,
		analysisId: r.analysis_id,
		engineVersion: r.engine_version,
		analysedAt: r.created_at instanceof Date ? r.created_at.toISOString() : String(r.created_at),
		warnings: readJson<AnalysisWarning[]>(r.warnings)
	}));
}

/**
 * The metrics and the two response curves the results pages draw, of these stored analyses: the
 * rest of the curves (decays, energy–time, waterfall — most of the column) is left in the database.
 */
export async function responseInputsOfAnalyses(
	k: Knex,
	analysisIds: number[]
): Promise<Map<number, { metrics: StoredMetrics; curves: Pick<AnalysisCurves, 'frequencyResponse' | 'frequencyResponseSmoothed'> }>> {
	if (analysisIds.length === 0) return new Map();
	const rows = await k('analyses')
		.whereIn('id', analysisIds)
		.select('id', 'metrics', k.raw("JSON_EXTRACT(curves, '$.frequencyResponse') as response"), k.raw("JSON_EXTRACT(curves, '$.frequencyResponseSmoothed') as smoothed"));
	return new Map(
		rows.map((r) => [
			r.id as number,
			{ metrics: readJson<StoredMetrics>(r.metrics), curves: { frequencyResponse: readJson(r.response), frequencyResponseSmoothed: readJson(r.smoothed) } }
		])
	);
}

/** Names the stored result of a capture: a re-analysis replaces the row, so the name changes with it. */
export async function analysisStamp(k: Knex, captureId: number): Promise<string | undefined> {
	const r = await k('analyses').where({ capture_id: captureId }).first('id', 'engine_version', 'created_at');
	if (!r) return undefined;
	const at = r.created_at instanceof Date ? r.created_at.getTime() : String(r.created_at);
	return `${r.id}-${at}-${r.engine_version}`;
}
