import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { unflatten } from 'devalue';
import { analyseImpulseResponse } from '../../src/lib/analysis/analyse';
import { exponentialNoiseDecay } from '../../src/lib/analysis/synthetic';
import { getAnalysis, replaceAnalysis } from '../../src/lib/server/queries/analyses';
import { getComparison } from '../../src/lib/server/queries/reviews';
import { loadComparisonModel, loadSessionSummary, roomFacts } from '../../src/lib/server/results/load';
import { positionFromAnalysis } from '../../src/lib/results/position';
import { summariseSession } from '../../src/lib/results/session';
import { compareSessions } from '../../src/lib/results/comparison';
import { comparisonView, DEFAULT_SMOOTHING, visitBands, visitResponses, visitResultsView, type ComparisonView, type VisitResultsView } from '../../src/lib/results/drawn';
import { packedTransport } from '../../src/lib/packed';
import { SMOOTHINGS } from '../../src/lib/schemas/results';
import type { SessionSummary } from '../../src/lib/results/types';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';

// The results pages cache what they work out from stored analyses. What they show must be what
// the uncached path gives from the whole stored rows — also after a capture is analysed again or
// a position renamed — and the pages and their on-demand routes must send exactly those values.
let k: Knex;
let organizationId: number;
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

/** A page's own data from its __data.json, decoded as the browser does (packed values included). */
async function pageData(answer: Response): Promise<Record<string, unknown>> {
	expect(answer.status).toBe(200);
	const body = await answer.json();
	return unflatten(body.nodes.at(-1).data, { Packed: packedTransport.decode }) as Record<string, unknown>;
}

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	organizationId = org;
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

	it('the visit page sends what it draws, as worked out without a cache: the default smoothing and the octave tables', async () => {
		const answer = await consultant.request('GET', `/sessions/${beforeId}/__data.json`);
		expect(answer.status).toBe(200);
		const summary = (await pageData(answer)).summary as VisitResultsView;
		const reference = await uncachedSummary(beforeId);
		const tag = (await consultant.get(`/api/sessions/${beforeId}/responses?smoothing=3`, { accept: 'application/json' })).headers.get('etag')!;
		expect(summary.tag).toBe(tag);
		expect(summary).toEqual(visitResultsView(reference, tag));
		for (const [i, p] of summary.responses.positions.entries()) expect(p.db).toEqual(reference.positions[i].response.smoothed[DEFAULT_SMOOTHING]);
		expect(summary.responses.average!.db).toEqual(reference.averageResponse!.smoothed[DEFAULT_SMOOTHING]);
		expect(summary.octaves.statistics).toEqual(reference.statistics);
		// One frequency grid, sent once.
		expect(summary.responses.positions[1].freqHz).toBe(summary.responses.positions[0].freqHz);
		expect(summary.responses.average!.freqHz).toBe(summary.responses.positions[0].freqHz);
	});

	it('every other smoothing and the one-third octaves of a visit are answered on demand, as worked out without a cache, with an entity tag', async () => {
		const reference = await uncachedSummary(beforeId);
		for (const smoothing of SMOOTHINGS) {
			const r = await consultant.get(`/api/sessions/${beforeId}/responses?smoothing=${smoothing}`, { accept: 'application/json' });
			expect(r.status).toBe(200);
			expect(r.headers.get('cache-control')).toBe('private, no-cache');
			const body = await r.json();
			expect(body).toEqual(JSON.parse(JSON.stringify(visitResponses(reference, smoothing))));
			body.positions.forEach((p: { db: number[] }, i: number) => expect(p.db).toEqual(reference.positions[i].response.smoothed[smoothing]));
			const again = await consultant.get(`/api/sessions/${beforeId}/responses?smoothing=${smoothing}`, { accept: 'application/json', 'if-none-match': r.headers.get('etag')! });
			expect(again.status).toBe(304);
			expect(await again.text()).toBe('');
		}
		const thirds = await consultant.get(`/api/sessions/${beforeId}/bands?kind=third`, { accept: 'application/json' });
		expect(thirds.status).toBe(200);
		const bands = await thirds.json();
		expect(bands).toEqual(JSON.parse(JSON.stringify(visitBands(reference, 'third'))));
		expect(bands.statistics).toEqual(JSON.parse(JSON.stringify(reference.thirds!.statistics)));
		expect(bands.positions[0].bands.map((b: { t30S: number }) => b.t30S)).toEqual(reference.positions[0].thirdBands!.map((b) => b.t30S));
		// What the routes do not know is refused with the field that is wrong.
		const wrong = await consultant.get(`/api/sessions/${beforeId}/responses?smoothing=5`, { accept: 'application/json' });
		expect(wrong.status).toBe(422);
		expect((await wrong.json()).errors.smoothing).toContain('smoothing=1, 3, 6, 12 or 24');
		expect((await consultant.get(`/api/sessions/${beforeId}/bands?kind=sixth`, { accept: 'application/json' })).status).toBe(422);
	});

	it('the comparison and report pages send what they draw; the other smoothings and the thirds are answered on demand; a client sees them only once published', async () => {
		const c = (await getComparison(k, comparisonId))!;
		const model = compareSessions(await roomFacts(k, tree.roomId), await uncachedSummary(beforeId), await uncachedSummary(afterId));
		const page = await pageData(await consultant.request('GET', `/comparisons/${comparisonId}/__data.json`));
		const view = page.model as ComparisonView;
		expect(view).toEqual(comparisonView(model, view.tag));
		expect(view.responses.before!.db).toEqual(model.baseline.averageResponse!.smoothed[DEFAULT_SMOOTHING]);
		for (const smoothing of SMOOTHINGS) {
			const r = await consultant.get(`/api/comparisons/${comparisonId}/responses?smoothing=${smoothing}`, { accept: 'application/json' });
			expect(r.headers.get('etag')).toBe(view.tag);
			const body = await r.json();
			expect(body.before.db).toEqual(model.baseline.averageResponse!.smoothed[smoothing]);
			expect(body.after.db).toEqual(model.treated.averageResponse!.smoothed[smoothing]);
		}
		const thirds = await (await consultant.get(`/api/comparisons/${comparisonId}/bands?kind=third`, { accept: 'application/json' })).json();
		expect(thirds).toEqual(JSON.parse(JSON.stringify({ bandKind: 'third', ...model.thirds })));
		expect(await loadComparisonModel(k, c)).toEqual(model);

		const clientUser = await makeUser(k, organizationId, 'client');
		await k('project_members').insert({ project_id: tree.projectId, user_id: clientUser.id });
		const client = await signedInClient(clientUser.email, TEST_PASSWORD);
		const paths = [`/api/comparisons/${comparisonId}/responses?smoothing=1`, `/api/comparisons/${comparisonId}/bands?kind=third`];
		for (const p of paths) expect((await client.get(p, { accept: 'application/json' })).status, p).toBe(404);
		// The visit's own routes are the practice's: never a client's.
		expect((await client.get(`/api/sessions/${beforeId}/responses?smoothing=1`, { accept: 'application/json' })).status).toBe(403);
		await k('comparisons').where({ id: comparisonId }).update({ published_at: new Date() });
		for (const p of paths) expect((await client.get(p, { accept: 'application/json' })).status, p).toBe(200);
		const report = await pageData(await client.request('GET', `/reports/${comparisonId}/__data.json`));
		expect((report.model as ComparisonView).tag).toBe(view.tag);
		await k('comparisons').where({ id: comparisonId }).update({ published_at: null });
	});

	it('analysing a capture again gives the results a new entity tag, so a browser holding the old ones is sent the new', async () => {
		const path = `/api/sessions/${afterId}/responses?smoothing=12`;
		const first = await consultant.get(path, { accept: 'application/json' });
		const tag = first.headers.get('etag')!;
		expect((await consultant.get(path, { accept: 'application/json', 'if-none-match': tag })).status).toBe(304);
		const comparisonTag = (await consultant.get(`/api/comparisons/${comparisonId}/responses?smoothing=12`, { accept: 'application/json' })).headers.get('etag')!;
		await replaceAnalysis(k, captureIds[3], analysis(0.3, 700));
		const changed = await consultant.get(path, { accept: 'application/json', 'if-none-match': tag });
		expect(changed.status).toBe(200);
		expect(changed.headers.get('etag')).not.toBe(tag);
		expect((await changed.json()).positions[1].db).toEqual((await uncachedSummary(afterId)).positions[1].response.smoothed['12']);
		const comparison = await consultant.get(`/api/comparisons/${comparisonId}/responses?smoothing=12`, { accept: 'application/json', 'if-none-match': comparisonTag });
		expect(comparison.status).toBe(200);
		expect(comparison.headers.get('etag')).not.toBe(comparisonTag);
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
