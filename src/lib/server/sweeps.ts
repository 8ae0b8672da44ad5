// Test signals: an exponential sine sweep made by the engine, stored as a WAV object, so later
// recordings of it are deconvolved against exactly the samples that were played.
import type { Knex } from 'knex';
import type { z } from 'zod';
import { encodeWav, generateExponentialSweep } from '../analysis';
import { recordAudit } from './audit';
import { newObjectKey, storage, type Storage } from './storage';
import { transaction } from './transaction';
import type { Scope } from './auth/access';
import type { sweepDefinitionSchema } from '../schemas/captures';

export type SweepInput = z.infer<typeof sweepDefinitionSchema>;

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

export function renderSweepWav(input: SweepInput): Uint8Array {
	const sweep = generateExponentialSweep({
		f1Hz: input.f1Hz,
		f2Hz: input.f2Hz,
		durationS: input.durationS,
		sampleRate: input.sampleRate,
		fadeInS: input.fadeS,
		fadeOutS: input.fadeS,
		amplitude: 10 ** (input.levelDbfs / 20),
		silenceS: input.silenceS
	});
	return encodeWav(sweep.samples, input.sampleRate, input.bitDepth === '32f' ? '32f' : (Number(input.bitDepth) as 16 | 24));
}

export async function createSweep(scope: Scope, input: SweepInput, s: Storage = storage()): Promise<number> {
	const key = newObjectKey('sweeps');
	const wav = renderSweepWav(input);
	await s.put(key, wav, 'audio/wav', wav.byteLength);
	try {
		return await transaction(async (trx) => {
			const [id] = await trx('sweep_definitions').insert({
				organization_id: scope.organizationId,
				name: input.name,
				f1_hz: input.f1Hz,
				f2_hz: input.f2Hz,
				duration_s: input.durationS,
				fade_in_s: input.fadeS,
				fade_out_s: input.fadeS,
				silence_s: input.silenceS,
				sample_rate: input.sampleRate,
				bit_depth: input.bitDepth,
				level_dbfs: input.levelDbfs,
				object_key: key,
				created_by: scope.user.id
			});
			await recordAudit(trx, { organizationId: scope.organizationId, userId: scope.user.id, action: 'sweep.created', entityType: 'sweep_definition', entityId: id });
			return id;
		});
	} catch (e) {
		await s.remove(key).catch(() => {}); // no orphaned object when the row could not be written
		throw e;
	}
}
