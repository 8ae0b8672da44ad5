import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { unflatten } from 'devalue';
import { analyseImpulseResponse } from '../../src/lib/analysis/analyse';
import { exponentialNoiseDecay } from '../../src/lib/analysis/synthetic';
import { getAnalysis, replaceAnalysis } from '../../src/lib/server/queries/analyses';
import { getComparison } from '../../src/lib/server/queries/reviews';
import { loadComparisonModel, loadSessionSummary, roomFacts, withoutRawLevels } from '../../src/lib/server/results/load';
import { positionFromAnalysis } from '../../src/lib/results/position';
import { summariseSession } from '../../src/lib/results/session';
import { compareSessions } from '../../src/lib/results/comparison';
import type { SessionSummary } from '../../src/lib/results/types';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';

// The results pages cache what they work out from stored analyses. What they show must be what
// the uncached path gives from the whole stored rows — also after a capture is analysed again or
// a position renamed — and the visit page must send exactly those values.
let k: Knex;
let tree: ProjectTree;
let consultant: Client;
let beforeId: number;
let afterId: number;
let comparisonId: number;
const captureIds: number[] = [];

function analysis(t60S: number, seed: number) {
	const ir = exponentialNoiseDecay({ t60S, durationS: 0.8, sampleRate: 48000, onsetS: 0.005, noiseDbRePeak: -75, seed });
	return { ...analyseImpulseResponse(ir, 48000, { bands: 'octave' }), thirdOctaveBands: analyseImpulseResponse(ir, 48000, { bands: 'third' }).bands };
}

async function analysedVisit(label: string, t60S: number, seed: number): Promise<number> {
	const [sessionId] = await k('sessions').insert({ room_id: tree.roomId, condition_label: label, measured_on: '2026-11-01' });
	for (const i of [0, 1]) {
		const [positionId] = await k('positions').insert({ session_id: sessionId, label: `P${i + 1}`, source_label: 'S1', mic_label: `seat ${i + 1}` });
		const [captureId] = await k('captures').insert({
			session_id: sessionId,
			position_id: positionId,
			kind: 'impulse',
			original_filename: `${label}-P${i + 1}.wav`,
			object_key: `test/cache/${sessionId}/${i}-${Date.now()}`,
			sample_rate: 48000,
			channels: 1,
			status: 'analysed'
		});
		captureIds.push(captureId);
		await replaceAnalysis(k, captureId, analysis(t60S * (1 + 0.05 * i), seed + i));
	}
	return sessionId;
}

/** The summary worked out without any cache, from the whole stored rows. */
async function uncachedSummary(sessionId: number): Promise<SessionSummary> {
	const s = await k('sessions').where({ id: sessionId }).first();
	const rows = await k('captures as c').join('positions as po', 'po.id', 'c.position_id').where({ 'c.session_id': sessionId, 'c.status': 'analysed' }).orderBy('po.label').select('c.id', 'po.label', 'po.source_label', 'po.mic_label');
	const positions = [];
	for (const r of rows) {
		const a = (await getAnalysis(k, r.id))!;
		positions.push(positionFromAnalysis(r.id, r.label, a.metrics, a.curves, { sourceLabel: r.source_label, micLabel: r.mic_label }));
	}
	return summariseSession({ sessionId, conditionLabel: s.condition_label, measuredOn: (await loadSessionSummary(k, sessionId)).measuredOn }, positions);
}

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	tree = await makeProjectTree(k, org);
	beforeId = await analysedVisit('untreated', 0.7, 300);
	afterId = await analysedVisit('treated', 0.45, 400);
	[comparisonId] = await k('comparisons').insert({ room_id: tree.roomId, baseline_session_id: beforeId, treated_session_id: afterId, title: 'Cache check' });
	consultant = await signedInClient((await makeUser(k, org, 'consultant')).email, TEST_PASSWORD);
}, 60_000);
afterAll(async () => k.destroy());

describe('cached results', () => {
	it('a visit summary equals the uncached one, and is reused while nothing changes', async () => {
		const first = await loadSessionSummary(k, beforeId);
		expect(first).toEqual(await uncachedSummary(beforeId));
		expect(await loadSessionSummary(k, beforeId)).toBe(first);
		expect(Object.isFrozen(first.positions[0].response.smoothed['6'])).toBe(true);
	});

	it('a comparison equals the one worked out from uncached summaries', async () => {
		const c = (await getComparison(k, comparisonId))!;
		expect(await loadComparisonModel(k, c)).toEqual(compareSessions(await roomFacts(k, tree.roomId), await uncachedSummary(beforeId), await uncachedSummary(afterId)));
	});

	it('analysing a capture again replaces what the pages show', async () => {
		const before = await loadSessionSummary(k, afterId);
		const c = (await getComparison(k, comparisonId))!;
		const modelBefore = await loadComparisonModel(k, c);
		await replaceAnalysis(k, captureIds[2], analysis(0.9, 500));
		const after = await loadSessionSummary(k, afterId);
		expect(after).not.toBe(before);
		expect(after).toEqual(await uncachedSummary(afterId));
		const t30 = (s: SessionSummary) => s.positions.find((p) => p.captureId === captureIds[2])!.bands.find((b) => b.centerHz === 1000)!.t30S!;
		// The decay's T60 went from 0.45 s to 0.9 s.
		expect(t30(after)).toBeGreaterThan(1.5 * t30(before));
		expect(await loadComparisonModel(k, c)).not.toEqual(modelBefore);
	});

	it('renaming a position shows the new label', async () => {
		await k('positions').where({ session_id: beforeId, label: 'P2' }).update({ label: 'P2 renamed' });
		const s = await loadSessionSummary(k, beforeId);
		expect(s.positions.map((p) => p.positionLabel)).toEqual(['P1', 'P2 renamed']);
		expect(s).toEqual(await uncachedSummary(beforeId));
	});

	it('the visit page sends the values it draws: bands, averages and every smoothed curve as worked out without a cache', async () => {
		const answer = await consultant.request('GET', `/sessions/${beforeId}/__data.json`);
		expect(answer.status).toBe(200);
		const body = await answer.json();
		const node = body.nodes.at(-1);
		const summary = unflatten(node.data).summary as SessionSummary;
		const reference = await uncachedSummary(beforeId);
		expect(summary).toEqual(withoutRawLevels(reference));
		for (const [i, p] of summary.positions.entries()) {
			for (const key of ['1', '3', '6', '12', '24'] as const) expect(p.response.smoothed[key]).toEqual(reference.positions[i].response.smoothed[key]);
			expect(p.response.freqHz).toEqual(reference.positions[i].response.freqHz);
			expect(p.bands).toEqual(reference.positions[i].bands);
		}
		expect(summary.averageResponse!.smoothed).toEqual(reference.averageResponse!.smoothed);
		expect(summary.statistics).toEqual(reference.statistics);
		// One frequency grid, sent once.
		expect(summary.positions[1].response.freqHz).toBe(summary.positions[0].response.freqHz);
		expect(summary.averageResponse!.freqHz).toBe(summary.positions[0].response.freqHz);
	});

	it('the analysis JSON carries an entity tag: the same result is answered 304 without a body, a new analysis 200 with a new tag', async () => {
		const path = `/api/captures/${captureIds[0]}/analysis`;
		const first = await consultant.request('GET', path, { headers: { accept: 'application/json' } });
		expect(first.status).toBe(200);
		const tag = first.headers.get('etag')!;
		expect(tag).toMatch(/^"a[\w.-]+"$/);
		expect(first.headers.get('cache-control')).toBe('private, no-cache');
		const stored = (await getAnalysis(k, captureIds[0]))!;
		expect((await first.json()).metrics).toEqual(JSON.parse(JSON.stringify(stored.metrics)));
		const again = await consultant.request('GET', path, { headers: { accept: 'application/json', 'if-none-match': tag } });
		expect(again.status).toBe(304);
		expect(await again.text()).toBe('');
		await replaceAnalysis(k, captureIds[0], analysis(0.5, 600));
		const changed = await consultant.request('GET', path, { headers: { accept: 'application/json', 'if-none-match': tag } });
		expect(changed.status).toBe(200);
		expect(changed.headers.get('etag')).not.toBe(tag);
		expect((await changed.json()).metrics.broadband).toEqual(JSON.parse(JSON.stringify((await getAnalysis(k, captureIds[0]))!.metrics.broadband)));
	});
});
