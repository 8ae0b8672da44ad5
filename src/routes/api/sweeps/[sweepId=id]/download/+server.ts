import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { db } from '$lib/server/db';
import { storage } from '$lib/server/storage';
import { getSweep } from '$lib/server/sweeps';
import type { RequestHandler } from './$types';

/** The test signal as a WAV file to play in the room. */
export const GET: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const sweepId = Number(params.sweepId);
		await authorize(locals, 'project:internal', { sweepId });
		const sweep = (await getSweep(db(), sweepId))!;
		const bytes = await storage().getBytes(sweep.objectKey);
		const name = `ringdown-sweep-${Math.round(sweep.f1Hz)}-${Math.round(sweep.f2Hz)}Hz-${sweep.durationS}s-${sweep.sampleRate / 1000}k.wav`;
		return new Response(bytes as Uint8Array<ArrayBuffer>, {
			headers: { 'content-type': 'audio/wav', 'content-length': String(bytes.byteLength), 'content-disposition': `attachment; filename="${name}"` }
		});
	});
