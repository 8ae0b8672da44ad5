// When the plain-words summary speaks of a change: from the just-noticeable differences of
// ISO 3382-1:2009 Annex A (from memory), 1 dB for C80 and 5 % for reverberation time, tested
// exactly at, just below and just above each.
import { describe, expect, it } from 'vitest';
import { compareSessions } from '../../../src/lib/results/comparison';
import { makeRoom, makeSession, type BandInput } from './factories';

const room = makeRoom({ roomUse: 'other' });
const visit = (bands: BandInput[]) => makeSession([{ label: 'P1', bands }]);
const CLARITY_BANDS_HZ = [500, 1000, 2000];

describe('a clarity sentence from a mean C80 change of 1 dB over 500 Hz – 2 kHz', () => {
	it.each([
		{ afterDb: 3, said: true, case: 'exactly 1 dB' },
		{ afterDb: 2.99, said: false, case: 'just under 1 dB' },
		{ afterDb: 3.01, said: true, case: 'just over 1 dB' },
		{ afterDb: 1, said: true, case: 'exactly −1 dB' },
		{ afterDb: 1.01, said: false, case: 'just under −1 dB in size' }
	])('C80 from 2 dB to $afterDb dB in each band ($case): said $said', ({ afterDb, said }) => {
		const before = visit(CLARITY_BANDS_HZ.map((centerHz) => ({ centerHz, t30S: 0.5, c80Db: 2 })));
		const after = visit(CLARITY_BANDS_HZ.map((centerHz) => ({ centerHz, t30S: 0.5, c80Db: afterDb })));
		const clarity = compareSessions(room, before, after).summary.filter((s) => s.startsWith('Clarity'));
		expect(clarity).toHaveLength(said ? 1 : 0);
		if (said) expect(clarity[0]).toMatch(afterDb > 2 ? /^Clarity for music \(C80\) rose by 1\.0 dB/ : /^Clarity for music \(C80\) fell by 1\.0 dB/);
	});
});

describe('a reverberation change of 5 % is worth a sentence', () => {
	// 0.484 s → 0.4598 s is −5 % to the last bit: (0.4598 − 0.484)/0.484 = −0.05 in binary too.
	it('the change these tests sit on is exactly 5 % in floating point', () => {
		expect((0.4598 - 0.484) / 0.484).toBe(-0.05);
		expect((0.5082 - 0.484) / 0.484).toBe(0.05);
	});

	it.each([
		{ afterS: 0.4598, said: true, case: 'exactly 5 % shorter' },
		{ afterS: 0.4599, said: false, case: 'just under 5 % shorter' },
		{ afterS: 0.4597, said: true, case: 'just over 5 % shorter' },
		{ afterS: 0.5082, said: true, case: 'exactly 5 % longer' },
		{ afterS: 0.5081, said: false, case: 'just under 5 % longer' }
	])('125 Hz from 0.484 s to $afterS s ($case): a band sentence $said', ({ afterS, said }) => {
		const before = visit([{ centerHz: 125, t30S: 0.484 }]);
		const after = visit([{ centerHz: 125, t30S: afterS }]);
		const sentences = compareSessions(room, before, after).summary.filter((s) => s.startsWith('At 125 Hz'));
		expect(sentences).toHaveLength(said ? 1 : 0);
	});

	it.each([
		{ afterS: 0.4598, sentence: /the reverberation time \(T30\) fell by 5 %, from 0\.48 s to 0\.46 s\.$/, case: 'exactly 5 % shorter' },
		{ afterS: 0.4599, sentence: /the reverberation time \(T30\) stayed about the same: 0\.48 s before, 0\.46 s after\.$/, case: 'just under 5 % shorter' }
	])('500 Hz and 1 kHz from 0.484 s to $afterS s ($case)', ({ afterS, sentence }) => {
		const before = visit([500, 1000].map((centerHz) => ({ centerHz, t30S: 0.484 })));
		const after = visit([500, 1000].map((centerHz) => ({ centerHz, t30S: afterS })));
		const mid = compareSessions(room, before, after).summary.filter((s) => s.startsWith('In the middle frequencies'));
		expect(mid).toHaveLength(1);
		expect(mid[0]).toMatch(sentence);
	});
});
