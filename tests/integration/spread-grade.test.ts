import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Knex } from 'knex';
import { analyseImpulseResponse } from '../../src/lib/analysis/analyse';
import { exponentialNoiseDecay } from '../../src/lib/analysis/synthetic';
import { replaceAnalysis } from '../../src/lib/server/queries/analyses';
import { testDb } from '../helpers/db';
import { makeOrganization, makeProjectTree, makeUser, TEST_PASSWORD, type ProjectTree } from '../helpers/factories';
import { Client, signedInClient } from '../helpers/http';
import { csvTable } from '../helpers/rfc4180';
import { inspectPdf, normaliseSpace, requirePoppler } from '../unit/reports/helpers/poppler';

// Spread, confidence interval and grade through the running app: the visit's export and page,
// the comparison's export, the client's report page and its PDF, from analyses the engine made.
let k: Knex;
let tree: ProjectTree;
let consultant: Client;
let client: Client;
let beforeId: number;
let afterId: number;
let comparisonId: number;
const SEATS = ['seat 1', 'seat 2', 'seat 3'];

/** A visit with three positions — one loudspeaker, three seats — each holding the engine's analysis of a decay of T = t60·(1 ± 4 %). */
async function analysedVisit(label: string, measuredOn: string, t60S: number, seed: number): Promise<number> {
	const [sessionId] = await k('sessions').insert({ room_id: tree.roomId, condition_label: label, measured_on: measuredOn });
	for (const [i, seat] of SEATS.entries()) {
		const [positionId] = await k('positions').insert({ session_id: sessionId, label: `P${i + 1}`, source_label: 'left loudspeaker', mic_label: seat });
		const [captureId] = await k('captures').insert({
			session_id: sessionId,
			position_id: positionId,
			kind: 'impulse',
			original_filename: `${label}-P${i + 1}.wav`,
			object_key: `test/${sessionId}/${i}-${Date.now()}-${seed}`,
			sample_rate: 48000,
			channels: 1,
			status: 'analysed'
		});
		const ir = exponentialNoiseDecay({ t60S: t60S * (1 + 0.04 * (i - 1)), durationS: 1.2, sampleRate: 48000, onsetS: 0.005, noiseDbRePeak: -75, seed: seed + i });
		const octaves = analyseImpulseResponse(ir, 48000, { bands: 'octave' });
		const thirds = analyseImpulseResponse(ir, 48000, { bands: 'third' });
		await replaceAnalysis(k, captureId, { ...octaves, thirdOctaveBands: thirds.bands });
	}
	return sessionId;
}

beforeAll(async () => {
	k = testDb();
	const org = await makeOrganization(k);
	const clientUser = await makeUser(k, org, 'client');
	tree = await makeProjectTree(k, org, clientUser.id);
	beforeId = await analysedVisit('untreated', '2026-11-01', 0.6, 100);
	afterId = await analysedVisit('treated', '2026-11-20', 0.4, 200);
	[comparisonId] = await k('comparisons').insert({ room_id: tree.roomId, baseline_session_id: beforeId, treated_session_id: afterId, title: 'Spread and grade', published_at: new Date() });
	consultant = await signedInClient((await makeUser(k, org, 'consultant')).email, TEST_PASSWORD);
	client = await signedInClient(clientUser.email, TEST_PASSWORD);
}, 60_000);
afterAll(async () => k.destroy());

/** The stored T30 of each position of a visit at one octave. */
async function storedT30(sessionId: number, centerHz: number): Promise<number[]> {
	const rows = await k('analyses as a').join('captures as c', 'c.id', 'a.capture_id').where('c.session_id', sessionId).select('a.metrics');
	return rows.map((r) => {
		const metrics = typeof r.metrics === 'string' ? JSON.parse(r.metrics) : r.metrics;
		return metrics.bands.find((b: { centerHz: number }) => b.centerHz === centerHz).t30S as number;
	});
}

describe('the visit average export', () => {
	it('gives each mean’s 95 % interval from the stored values, ISO 3382-2’s σ and the grade', async () => {
		const res = await consultant.get(`/api/sessions/${beforeId}/average?format=csv`);
		expect(res.status).toBe(200);
		const row = csvTable(await res.text()).find((r) => r.centre_Hz === '1000')!;
		// Mean ± t(0.975, 2)·s/√3 with t = 4.303 (NIST/SEMATECH e-Handbook 1.3.6.7.2), from the three stored T30s.
		const t30 = await storedT30(beforeId, 1000);
		const mean = t30.reduce((a, b) => a + b, 0) / 3;
		const s = Math.sqrt(t30.reduce((a, v) => a + (v - mean) ** 2, 0) / 2);
		expect(Number(row.T30_ci95_low_s)).toBeCloseTo(mean - (4.303 * s) / Math.sqrt(3), 3);
		expect(Number(row.T30_ci95_high_s)).toBeCloseTo(mean + (4.303 * s) / Math.sqrt(3), 3);
		// σ(T30) = 0.55·T·√((1 + 1.52/10)/(3·0.71·1000·T)) (ISO 3382-2:2008, constants from memory).
		expect(Number(row.T30_iso_sigma_s)).toBeCloseTo(0.55 * mean * Math.sqrt(1.152 / (3 * 710 * mean)), 3);
		// One loudspeaker, three seats: survey (ISO 3382-2:2008 Table 1, from memory).
		expect([row.grade, row.source_positions, row.microphone_positions, row.combinations]).toEqual(['survey', '1', '3', '3']);
	});

	it('carries the grade, what the next grade needs and the one-third-octave statistics in JSON', async () => {
		const json = await (await consultant.get(`/api/sessions/${beforeId}/average?format=json`, { accept: 'application/json' })).json();
		expect(json.statistics.grade.grade).toBe('survey');
		expect(json.statistics.grade.next.shortfalls).toEqual(['engineering needs 2 source positions; this visit has 1', 'engineering needs 6 source–microphone combinations; this visit has 3']);
		expect(json.thirds.statistics.bandKind).toBe('third');
		expect(json.thirds.bands).toHaveLength(24);
		// T = 0.6 s ± 4 % at the three positions: T_mid within the 5 % JND of 0.6 s (ISO 3382-1 Annex A, from memory).
		expect(Math.abs(json.statistics.midFrequency.valueS / 0.6 - 1)).toBeLessThan(0.05);
	});
});

describe('the visit page', () => {
	it('shows the grade and the spread table', async () => {
		const html = await (await consultant.get(`/sessions/${beforeId}`, { accept: 'text/html' })).text();
		expect(html).toContain('data-grade="survey"');
		expect(html).toContain('Survey grade (ISO 3382-2)');
		expect(html).toContain('data-testid="spread-table"');
	});
});

describe('the comparison export', () => {
	it('judges a 0.6 s → 0.4 s change at positions that agree to 4 % as a real change, and lists the positions', async () => {
		const json = await (await consultant.get(`/api/comparisons/${comparisonId}/export?format=json`, { accept: 'application/json' })).json();
		const band = json.bands.find((b: { centerHz: number }) => b.centerHz === 1000);
		expect(band.judgements.t30S.verdict).toBe('beyond');
		expect(Math.abs(band.judgements.t30S.difference)).toBeGreaterThan(band.judgements.t30S.spreadLimit);
		expect(json.positions.map((p: { positionLabel: string }) => p.positionLabel)).toEqual(['P1', 'P2', 'P3']);
		expect(json.statistics.baseline.grade.grade).toBe('survey');
		expect(json.thirds.bands).toHaveLength(24);
		const csv = csvTable(await (await consultant.get(`/api/comparisons/${comparisonId}/export?format=csv`)).text());
		expect(csv.find((r) => r.centre_Hz === '1000')?.T30_against_spread).toBe('beyond');
	});
});

describe('the client report', () => {
	it('shows each visit’s grade and the positions one by one on the page', async () => {
		const html = await (await client.get(`/reports/${comparisonId}`, { accept: 'text/html' })).text();
		expect(html).toContain('Before: Survey grade (ISO 3382-2)');
		expect(html.match(/data-testid="position-row"/g)).toHaveLength(3);
		expect(html).not.toContain('engineering method');
	});

	it('prints the grades and the spread in the PDF', async () => {
		requirePoppler();
		const pdf = await client.get(`/api/comparisons/${comparisonId}/report.pdf`);
		expect(pdf.status).toBe(200);
		const text = normaliseSpace(inspectPdf(new Uint8Array(await pdf.arrayBuffer())).text);
		expect(text).toContain('How sure these numbers are');
		expect(text).toContain('Before: Survey grade (ISO 3382-2).');
		expect(text).toContain('A real change');
		expect(text).toContain('reach its survey grade');
	});
});
