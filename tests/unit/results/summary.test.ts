import { describe, expect, it } from 'vitest';
import type { TargetBand } from '../../../src/lib/analysis/targets';
import { compareSessions } from '../../../src/lib/results/comparison';
import { MAX_SUMMARY_SENTENCES, plainSummary } from '../../../src/lib/results/summary';
import { makeRoom, makeSession, type BandInput, type PositionInput } from './factories';

/** Every position of a visit gets the same bands, so each band's mean is the value given. */
const visit = (labels: string[], bands: BandInput[], extra: Partial<PositionInput> = {}) =>
	makeSession(labels.map((label) => ({ label, bands, ...extra })));

const band = (centerHz: number, lowerS: number, upperS: number, targetS = (lowerS + upperS) / 2): TargetBand => ({ centerHz, targetS, lowerS, upperS });

// No default target (room used for other purposes) unless a test gives one.
const otherRoom = makeRoom({ roomUse: 'other' });

describe('plainSummary: a typical treatment', () => {
	const baseline = visit(['P1', 'P2', 'P3', 'P4'], [
		{ centerHz: 63, t30S: 0.9 },
		{ centerHz: 125, t30S: 0.92 },
		{ centerHz: 250, t30S: 0.8 },
		{ centerHz: 500, t30S: 0.6 },
		{ centerHz: 1000, t30S: 0.6 },
		{ centerHz: 2000, t30S: 0.5 }
	]);
	const treated = visit(['P1', 'P2', 'P3'], [
		{ centerHz: 63, t30S: null, t20S: null },
		{ centerHz: 125, t30S: 0.48 },
		{ centerHz: 250, t30S: 0.67 },
		{ centerHz: 500, t30S: 0.4 },
		{ centerHz: 1000, t30S: 0.4 },
		{ centerHz: 2000, t30S: 0.48 } // −4 %: under the 5 % JND (ISO 3382-1 Annex A, from memory), no sentence
	]);
	// 0.48 s lies inside 125 Hz's 0.40…0.55 s; 0.67 s is 0.12 s over 250 Hz's upper limit 0.55 s.
	const target = [band(125, 0.4, 0.55), band(250, 0.45, 0.55)];
	const summary = compareSessions(otherRoom, baseline, treated, { target }).summary;
	const change = (0.4 - 0.6) / 0.6; // −33 %, the mid-frequency change

	it.each([
		`In the middle frequencies (500 Hz and 1 kHz) the reverberation time (T30) fell by ${Math.round(Math.abs(100 * change))} %, from 0.60 s to 0.40 s.`,
		'1 of 2 frequency bands is now inside the target for this room, against 0 before.',
		'At 125 Hz reverberation fell from 0.92 s to 0.48 s and is now inside the target.',
		'At 250 Hz reverberation fell from 0.80 s to 0.67 s and is still 0.12 s above the target.',
		'At 500 Hz reverberation fell from 0.60 s to 0.40 s.',
		'At 1 kHz reverberation fell from 0.60 s to 0.40 s.',
		'Reverberation could not be measured reliably at 63 Hz in the treated visit.',
		'Compared at 3 positions measured in both visits; P4 was measured only before.'
	])('says: %s', (sentence) => {
		expect(summary).toContain(sentence);
	});

	it('says nothing about a band that changed by less than 5 % without a verdict change', () => {
		expect(summary.some((s) => s.includes('2 kHz'))).toBe(false);
	});

	it('orders overall, bands low to high, missing values, positions', () => {
		expect(summary).toHaveLength(8);
		expect(summary[0]).toMatch(/^In the middle frequencies/);
		expect(summary.slice(2, 6).map((s) => s.match(/^At (\S+ k?Hz)/)?.[1])).toEqual(['125 Hz', '250 Hz', '500 Hz', '1 kHz']);
		expect(summary[6]).toMatch(/could not be measured/);
		expect(summary[7]).toMatch(/^Compared at/);
	});

	it('names the standard term once and plain "reverberation" after it', () => {
		expect(summary.filter((s) => s.includes('(T30)'))).toHaveLength(1);
	});

	it('is a pure function of the model', () => {
		expect(plainSummary(compareSessions(otherRoom, baseline, treated, { target }))).toEqual(summary);
	});
});

describe('plainSummary: band sentences', () => {
	it('introduces the term in the first band sentence when there is no mid-frequency sentence', () => {
		const model = compareSessions(otherRoom, visit(['P1'], [{ centerHz: 125, t30S: 0.92 }]), visit(['P1'], [{ centerHz: 125, t30S: 0.48 }]), { target: [band(125, 0.4, 0.55)] });
		expect(model.summary).toContain('At 125 Hz the reverberation time (T30) fell from 0.92 s to 0.48 s and is now inside the target.');
	});

	// The 5 % threshold is the JND of reverberation time (ISO 3382-1:2009 Annex A, from memory).
	it.each([
		{ after: 0.4755, said: false }, // −4.9 %
		{ after: 0.4745, said: true }, // −5.1 %
		{ after: 0.526, said: true }, // +5.2 %
		{ after: 0.51, said: false } // +2 %
	])('4 kHz from 0.50 s to $after s: a sentence $said', ({ after, said }) => {
		const model = compareSessions(otherRoom, visit(['P1'], [{ centerHz: 4000, t30S: 0.5 }]), visit(['P1'], [{ centerHz: 4000, t30S: after }]));
		expect(model.summary.some((s) => s.startsWith('At 4 kHz'))).toBe(said);
	});

	it('reports a verdict change even under 5 %', () => {
		const model = compareSessions(otherRoom, visit(['P1'], [{ centerHz: 4000, t30S: 0.53 }]), visit(['P1'], [{ centerHz: 4000, t30S: 0.51 }]), { target: [band(4000, 0.4, 0.52)] });
		expect(model.summary).toContain('At 4 kHz the reverberation time (T30) fell from 0.53 s to 0.51 s and is now inside the target.');
	});

	it.each([
		{ before: 0.3, after: 0.2, lower: 0.25, text: 'fell from 0.30 s to 0.20 s and is now 0.05 s below the target' },
		{ before: 0.6, after: 0.3, lower: 0.4, text: 'fell from 0.60 s to 0.30 s and is now 0.10 s below the target' },
		{ before: 0.2, after: 0.1, lower: 0.25, text: 'fell from 0.20 s to 0.10 s and is still 0.15 s below the target' },
		{ before: 0.3, after: 0.45, lower: 0.25, text: 'rose from 0.30 s to 0.45 s and is now 0.05 s above the target' }
	])('below and above: $text', ({ before, after, lower, text }) => {
		const model = compareSessions(otherRoom, visit(['P1'], [{ centerHz: 500, t30S: before }]), visit(['P1'], [{ centerHz: 500, t30S: after }]), { target: [band(500, lower, 0.4)] });
		expect(model.summary).toContain(`At 500 Hz the reverberation time (T30) ${text}.`);
	});

	it('takes T_mid band by band: T30, else T20, and names both when both were used', () => {
		const before = visit(['P1'], [{ centerHz: 500, t30S: null, t20S: 0.7 }, { centerHz: 1000, t30S: 0.5 }]);
		const after = visit(['P1'], [{ centerHz: 500, t30S: 0.4 }, { centerHz: 1000, t30S: 0.4 }]);
		// Before (0.70 + 0.50) / 2 = 0.60 s, after 0.40 s: −33 %.
		expect(compareSessions(otherRoom, before, after).summary[0]).toBe(
			'In the middle frequencies (500 Hz and 1 kHz) the reverberation time (T30, and T20 where T30 could not be measured reliably) fell by 33 %, from 0.60 s to 0.40 s.'
		);
	});

	it('says where T20 stood in for T30', () => {
		const model = compareSessions(otherRoom, visit(['P1'], [{ centerHz: 125, t30S: null, t20S: 0.92 }]), visit(['P1'], [{ centerHz: 125, t30S: 0.48 }]), { target: [band(125, 0.4, 0.55)] });
		expect(model.summary).toContain(
			'At 125 Hz the reverberation time (T30) fell from 0.92 s to 0.48 s and is now inside the target (from T20 in the baseline visit, where T30 could not be measured reliably).'
		);
	});

	it.each([
		{ before: [null, 0.5], after: [0.4, null], sentences: ['could not be measured reliably at 63 Hz in the baseline visit.', 'could not be measured reliably at 8 kHz in the treated visit.'] },
		{ before: [0.5, 0.5], after: [null, null], sentences: ['could not be measured reliably at 63 Hz and 8 kHz in the treated visit.'] },
		{ before: [null, 0.5], after: [null, 0.5], sentences: ['could not be measured reliably at 63 Hz in either visit.'] }
	])('missing values are grouped by visit: $sentences', ({ before, after, sentences }) => {
		const bands = (values: (number | null)[]) => [{ centerHz: 63, t30S: values[0] }, { centerHz: 8000, t30S: values[1] }];
		const summary = compareSessions(otherRoom, visit(['P1'], bands(before)), visit(['P1'], bands(after))).summary;
		const missing = summary.filter((s) => s.includes('could not be measured'));
		expect(missing.map((s) => s.replace(/^.*? could not/, 'could not'))).toEqual(sentences);
	});

	it('keeps to the sentence limit, preferring verdict changes, and still orders bands low to high', () => {
		// 24 one-third-octave bands 50 Hz…10 kHz, each 30 % shorter after, except 2 kHz (3 %), whose verdict changes.
		const centres = [50, 63, 80, 100, 125, 160, 200, 250, 315, 400, 500, 630, 800, 1000, 1250, 1600, 2000, 2500, 3150, 4000, 5000, 6300, 8000, 10000];
		const before = centres.map((centerHz) => ({ centerHz, t30S: 0.6 }));
		const after = centres.map((centerHz) => ({ centerHz, t30S: centerHz === 2000 ? 0.582 : 0.42 }));
		const summary = compareSessions(otherRoom, visit(['P1'], before), visit(['P1'], after), { target: [band(2000, 0.3, 0.59)] }).summary;
		expect(summary.length).toBeLessThanOrEqual(MAX_SUMMARY_SENTENCES);
		const bandsSaid = summary.filter((s) => s.startsWith('At ')).map((s) => s.match(/^At (\S+) (k?Hz)/)?.slice(1).join(' '));
		expect(bandsSaid).toContain('2 kHz');
		const hz = bandsSaid.map((label) => (label?.endsWith('kHz') ? 1000 : 1) * parseFloat(label ?? ''));
		expect(hz).toEqual([...hz].sort((a, b) => a - b));
	});
});

describe('plainSummary: clarity, reflections, positions', () => {
	// C80 change averaged over the bands 500 Hz…2 kHz; said from its JND, 1 dB (ISO 3382-1 Annex A, from memory).
	it.each([
		{ diffs: [3.0, 3.1, 3.2], sentence: 'Clarity for music (C80) rose by 3.1 dB on average between 500 Hz and 2 kHz.' },
		{ diffs: [-1.2, -1.5, -1.8], sentence: 'Clarity for music (C80) fell by 1.5 dB on average between 500 Hz and 2 kHz.' },
		{ diffs: [0.8, 0.9, 1.0], sentence: null }
	])('C80 changes $diffs dB: $sentence', ({ diffs, sentence }) => {
		const centres = [500, 1000, 2000];
		const before = centres.map((centerHz) => ({ centerHz, t30S: 0.5, c80Db: 2 }));
		const after = centres.map((centerHz, i) => ({ centerHz, t30S: 0.5, c80Db: 2 + diffs[i] }));
		// 4 kHz lies outside the range: a large change there must not move the average.
		before.push({ centerHz: 4000, t30S: 0.5, c80Db: 0 });
		after.push({ centerHz: 4000, t30S: 0.5, c80Db: 20 });
		const summary = compareSessions(otherRoom, visit(['P1'], before), visit(['P1'], after)).summary;
		const clarity = summary.filter((s) => s.startsWith('Clarity'));
		expect(clarity).toEqual(sentence === null ? [] : [sentence]);
	});

	it('counts reflections within 15 ms and less than 10 dB below the direct sound (ITU-R BS.1116-3, from memory), per matched position', () => {
		const bands = [{ centerHz: 500, t30S: 0.5 }];
		// The factory puts reflection i at 2 + i ms.
		const baseline = makeSession([
			{ label: 'P1', bands, reflectionLevelsDb: [-3, -6, -10, -15, -19, -25] }, // 2 (−10 dB is 10 dB below: not counted)
			{ label: 'P2', bands, reflectionLevelsDb: [-4, -8, -12, -16, -20, ...Array(10).fill(-30), -2] }, // 2 (−2 dB at 17 ms is too late)
			{ label: 'P9', bands, reflectionLevelsDb: [-1, -1, -1, -1, -1, -1, -1, -1] } // not matched
		]);
		const treated = makeSession([
			{ label: 'P1', bands, reflectionLevelsDb: [-12, -18, -21] },
			{ label: 'P2', bands, reflectionLevelsDb: [-9, -14] }
		]);
		const summary = compareSessions(otherRoom, baseline, treated).summary;
		expect(summary).toContain('Strong early reflections (within 15 ms, less than 10 dB below the direct sound): 2 before, 0.5 after (average per position).');
		expect(summary[summary.length - 2]).toMatch(/^Strong early reflections/);
	});

	it.each([
		{ before: ['P1', 'P2'], after: ['P1', 'P2'], sentence: 'Compared at 2 positions measured in both visits.' },
		{ before: ['P1'], after: ['P1', 'P5'], sentence: 'Compared at 1 position measured in both visits; P5 was measured only after.' },
		{ before: ['P1', 'P4', 'P6'], after: ['P1', 'P7'], sentence: 'Compared at 1 position measured in both visits; P4 and P6 were measured only before and P7 only after.' },
		{ before: ['A'], after: ['B'], sentence: 'No position was measured in both visits, so the visits cannot be compared position by position.' }
	])('positions $before → $after', ({ before, after, sentence }) => {
		const bands = [{ centerHz: 500, t30S: 0.5 }];
		const summary = compareSessions(otherRoom, visit(before, bands), visit(after, bands)).summary;
		expect(summary[summary.length - 1]).toBe(sentence);
	});
});
