import { authorize } from '$lib/server/auth/access';
import { answer } from '$lib/server/api';
import { sweepFile } from '$lib/server/sweeps/service';
import type { RequestHandler } from './$types';

/** The test signal as a WAV file to play in the room. */
export const GET: RequestHandler = async ({ locals, params }) =>
	answer(async () => {
		const sweepId = Number(params.sweepId);
		await authorize(locals, 'project:internal', { sweepId });
		const { name, bytes } = await sweepFile(sweepId);
		return new Response(bytes as Uint8Array<ArrayBuffer>, {
			headers: { 'content-type': 'audio/wav', 'content-length': String(bytes.byteLength), 'content-disposition': `attachment; filename="${name}"` }
		});
	});
