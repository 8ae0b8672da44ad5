import type { Knex } from 'knex';

export type CaptureStatus = 'awaiting_upload' | 'queued' | 'analysing' | 'analysed' | 'failed';

export interface CaptureRow {
	id: number;
	sessionId: number;
	positionId: number;
	positionLabel: string;
	kind: 'impulse' | 'sweep';
	filename: string;
	objectKey: string;
	referenceObjectKey: string | null;
	sweepDefinitionId: number | null;
	sha256: string | null;
	sizeBytes: number | null;
	sampleRate: number | null;
	channels: number | null;
	channel: number;
	durationS: number | null;
	status: CaptureStatus;
	error: string | null;
	createdAt: Date;
	updatedAt: Date;
}

const columns = {
	id: 'c.id',
	sessionId: 'c.session_id',
	positionId: 'c.position_id',
	positionLabel: 'po.label',
	kind: 'c.kind',
	filename: 'c.original_filename',
	objectKey: 'c.object_key',
	referenceObjectKey: 'c.reference_object_key',
	sweepDefinitionId: 'c.sweep_definition_id',
	sha256: 'c.sha256',
	sizeBytes: 'c.size_bytes',
	sampleRate: 'c.sample_rate',
	channels: 'c.channels',
	channel: 'c.channel',
	durationS: 'c.duration_s',
	status: 'c.status',
	error: 'c.error',
	createdAt: 'c.created_at',
	updatedAt: 'c.updated_at'
};

const base = (k: Knex) => k('captures as c').join('positions as po', 'po.id', 'c.position_id');

export async function listCaptures(k: Knex, sessionId: number): Promise<CaptureRow[]> {
	return base(k).where('c.session_id', sessionId).orderBy('po.label').orderBy('c.id').select(columns);
}

export async function getCapture(k: Knex, id: number): Promise<CaptureRow | undefined> {
	return base(k).where('c.id', id).first(columns);
}

export async function findDuplicate(k: Knex, sessionId: number, sha256: string): Promise<CaptureRow | undefined> {
	return base(k).where({ 'c.session_id': sessionId, 'c.sha256': sha256 }).first(columns);
}

/** Warnings and headline numbers of each capture's analysis, for lists. */
export async function analysisSummaries(k: Knex, captureIds: number[]): Promise<Map<number, { engineVersion: string; warnings: unknown[]; metrics: Record<string, unknown> }>> {
	if (captureIds.length === 0) return new Map();
	const rows = await k('analyses').whereIn('capture_id', captureIds).select('capture_id', 'engine_version', 'warnings', 'metrics');
	const parse = (v: unknown) => (typeof v === 'string' ? JSON.parse(v) : v);
	return new Map(rows.map((r) => [r.capture_id, { engineVersion: r.engine_version, warnings: parse(r.warnings), metrics: parse(r.metrics) }]));
}
