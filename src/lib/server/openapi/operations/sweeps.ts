// The test signals a practice plays.
import type { ApiOperation } from '../registry';
import { binary } from '../shapes';

export const sweepOperations: ApiOperation[] = [
	{
		method: 'get',
		route: '/api/sweeps/[sweepId=id]/download',
		resource: 'Test signals',
		operationId: 'downloadTestSignal',
		summary: 'A test signal as a WAV file',
		description: 'The exponential sine sweep exactly as stored: recordings of it are deconvolved against these samples. Measurement sweeps are loud: start quiet and protect everyone\'s hearing.',
		access: 'project:internal',
		responses: { 200: { description: 'The WAV file, as a download.', content: { 'audio/wav': { schema: binary('A WAV file.') } } } },
		errors: { 404: 'No such test signal within your reach, or its file is no longer stored.' }
	}
];
