// Test signals: an exponential sine sweep made by the engine, stored as a WAV object, so later
// recordings of it are deconvolved against exactly the samples that were played.
import type { z } from 'zod';
import { encodeWav, generateExponentialSweep } from '../../analysis';
import { audit } from '../audit';
import { db } from '../db';
import { newObjectKey, storage, type Storage } from '../storage';
import { transaction } from '../transaction';
import { notFound } from '../problem';
import type { Scope } from '../auth/access';
import { getSweep, insertSweep, listSweeps, type SweepRow } from '../queries/sweeps';
import type { sweepDefinitionSchema } from '../../schemas/captures';

export type SweepInput = z.infer<typeof sweepDefinitionSchema>;
export type { SweepRow };

const WAV_TYPE = 'audio/wav';

const isMissingObject = (e: unknown) => {
	const x = e as { name?: string; $metadata?: { httpStatusCode?: number } };
	return x?.name === 'NoSuchKey' || x?.name === 'NotFound' || x?.$metadata?.httpStatusCode === 404;
};

export function sweepsOf(organizationId: number): Promise<SweepRow[]> {
	return listSweeps(db(), organizationId);
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
	const objectKey = newObjectKey('sweeps');
	const wav = renderSweepWav(input);
	await s.put(objectKey, wav, WAV_TYPE, wav.byteLength);
	try {
		return await transaction(async (trx) => {
			const id = await insertSweep(trx, {
				organizationId: scope.organizationId,
				name: input.name,
				f1Hz: input.f1Hz,
				f2Hz: input.f2Hz,
				durationS: input.durationS,
				fadeInS: input.fadeS,
				fadeOutS: input.fadeS,
				silenceS: input.silenceS,
				sampleRate: input.sampleRate,
				bitDepth: input.bitDepth,
				levelDbfs: input.levelDbfs,
				objectKey,
				createdBy: scope.user.id
			});
			await audit(trx, scope, 'sweep.created', 'sweep_definition', id);
			return id;
		});
	} catch (e) {
		await s.remove(objectKey).catch(() => {}); // no orphaned object when the row could not be written
		throw e;
	}
}

/** The stored WAV of a test signal, with a file name that says what it is. */
export async function sweepFile(sweepId: number, s: Storage = storage()): Promise<{ name: string; bytes: Uint8Array }> {
	const sweep = (await getSweep(db(), sweepId))!;
	let bytes: Uint8Array;
	try {
		bytes = await s.getBytes(sweep.objectKey);
	} catch (e) {
		// The row outlived its object (removed by hand, a store restored from an older copy).
		if (isMissingObject(e)) throw notFound('This test signal is no longer stored: make it again.');
		throw e;
	}
	const name = `ringdown-sweep-${Math.round(sweep.f1Hz)}-${Math.round(sweep.f2Hz)}Hz-${sweep.durationS}s-${sweep.sampleRate / 1000}k.wav`;
	return { name, bytes };
}
