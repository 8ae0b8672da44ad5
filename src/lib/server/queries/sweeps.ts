// Test signals (sweep definitions) of an organization; the WAV itself is an object in storage.
import type { Knex } from 'knex';

export interface SweepRow {
	id: number;
	name: string;
	f1Hz: number;
	f2Hz: number;
	durationS: number;
	fadeInS: number;
	fadeOutS: number;
	silenceS: number;
	sampleRate: number;
	bitDepth: string;
	levelDbfs: number;
	objectKey: string;
	createdAt: Date;
}

const columns = {
	id: 'id',
	name: 'name',
	f1Hz: 'f1_hz',
	f2Hz: 'f2_hz',
	durationS: 'duration_s',
	fadeInS: 'fade_in_s',
	fadeOutS: 'fade_out_s',
	silenceS: 'silence_s',
	sampleRate: 'sample_rate',
	bitDepth: 'bit_depth',
	levelDbfs: 'level_dbfs',
	objectKey: 'object_key',
	createdAt: 'created_at'
};

export async function listSweeps(k: Knex, organizationId: number): Promise<SweepRow[]> {
	return k('sweep_definitions').where({ organization_id: organizationId }).orderBy('created_at', 'desc').select(columns);
}

export async function getSweep(k: Knex, id: number): Promise<SweepRow | undefined> {
	return k('sweep_definitions').where({ id }).first(columns);
}

export async function isSweepOfOrganization(k: Knex, id: number, organizationId: number): Promise<boolean> {
	return Boolean(await k('sweep_definitions').where({ id, organization_id: organizationId }).first('id'));
}

export type NewSweep = Omit<SweepRow, 'id' | 'createdAt'> & { organizationId: number; createdBy: number };

export async function insertSweep(k: Knex, s: NewSweep): Promise<number> {
	const [id] = await k('sweep_definitions').insert({
		organization_id: s.organizationId,
		name: s.name,
		f1_hz: s.f1Hz,
		f2_hz: s.f2Hz,
		duration_s: s.durationS,
		fade_in_s: s.fadeInS,
		fade_out_s: s.fadeOutS,
		silence_s: s.silenceS,
		sample_rate: s.sampleRate,
		bit_depth: s.bitDepth,
		level_dbfs: s.levelDbfs,
		object_key: s.objectKey,
		created_by: s.createdBy
	});
	return id;
}
