import { describe, expect, it } from 'vitest';
import { defaultTarget } from '../../../src/lib/results/comparison';
import { makeRoom } from './factories';

describe('defaultTarget over the extra octaves', () => {
	it('draws the ITU-R BS.1116-3 target over 63 Hz – 8 kHz only, so 31.5 Hz and 16 kHz get none (mask range from memory)', () => {
		const centres = [31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000, 16000];
		expect(defaultTarget(makeRoom(), centres).map((t) => t.centerHz)).toEqual([63, 125, 250, 500, 1000, 2000, 4000, 8000]);
		expect(defaultTarget(makeRoom({ roomUse: 'other' }), centres)).toEqual([]);
		expect(defaultTarget(makeRoom(), [31.5, 16000])).toEqual([]);
	});
});
