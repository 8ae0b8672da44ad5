import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { decodeWav, encodeWav } from '../../src/lib/analysis';
import { launch, newPage, signIn } from './browser';
import { repeatedRecording } from '../helpers/room-recording';
import { createTestSignal, newVisit, openMeasurePage, startAndCheckLevel } from './measure-steps';
import { DEMO_PROJECTS } from '../../scripts/demo/scenario';
import { synthesiseResponse, UNTREATED } from '../../scripts/demo/room-response';

// The closing run of measuring in the browser: three positions of the demo room, one after the
// other with "Next position", timed from opening the measurement page to the third result on
// screen. The fake microphone hears the demo room's untreated response at P1 (made from
// formulas, as the demo's own captures) for every take: Chromium's fake device plays one file.
// MEASURE_SWEEP_S and MEASURE_REPETITIONS change the test signal's length and the repetitions.
const SR = 48_000;
const SWEEP_S = Number(process.env.MEASURE_SWEEP_S ?? 5);
const REPETITIONS = Number(process.env.MEASURE_REPETITIONS ?? 2);
const SIGNAL = { f1Hz: 20, f2Hz: 20_000, durationS: SWEEP_S, silenceS: 2, sampleRate: SR };
const dir = mkdtempSync(join(tmpdir(), 'ringdown-measure3-'));
let browser: Browser;
let signalName: string;
let visitUrl: string;

beforeAll(async () => {
	const setup = await launch();
	const page = await newPage(setup);
	await signIn(page, 'acoustician@fenwick-hale.test');
	const signal = await createTestSignal(page, `Three positions ${SWEEP_S} s ${Date.now()}`, SIGNAL);
	signalName = signal.name;
	const sweep = decodeWav(new Uint8Array(await (await page.request.get(`/api/sweeps/${signal.id}/download`)).body())).samples;
	visitUrl = await newVisit(page, `three positions ${Date.now()}`);
	await setup.close();

	const demo = DEMO_PROJECTS[0];
	const p1 = demo.positions[0];
	const ir = synthesiseResponse({ lengthM: demo.room.lengthM, widthM: demo.room.widthM, heightM: demo.room.heightM }, p1.source, p1.mic, UNTREATED, 1000);
	const take = (gain: number, noiseRms: number) => repeatedRecording({ signal: sweep, ir, sampleRate: SR, repetitions: REPETITIONS, leadInS: 0.75, tailS: 2, gain, noiseRms, seed: 1 });
	let peak = 0;
	for (const v of take(1, 0).samples) peak = Math.max(peak, Math.abs(v));
	// About −6 dBFS at the peak, with a background 60 dB below it.
	writeFileSync(join(dir, 'demo-room-p1.wav'), encodeWav(take(0.5 / peak, 5e-4).samples, SR, 16));
	browser = await launch({ fakeAudioCapture: `${join(dir, 'demo-room-p1.wav')}%noloop` });
});

afterAll(async () => browser?.close());

describe('three positions of the demo room, measured in the browser', () => {
	it('measures P1, P2 and P3 with "Next position" and shows each analysed', async () => {
		const page = await newPage(browser);
		await signIn(page, 'acoustician@fenwick-hale.test');
		const started = Date.now();
		await openMeasurePage(page, visitUrl);
		const check = await startAndCheckLevel(page, signalName);
		expect(await check.getAttribute('data-verdict')).toBe('good');
		await page.getByLabel('Repetitions').fill(String(REPETITIONS));
		const steps: { label: string; atS: number; recordS: number; alignS: number; uploadS: number }[] = [];
		for (const label of ['P1', 'P2', 'P3']) {
			if (label !== 'P1') await page.getByRole('button', { name: 'Next position' }).click();
			await page.getByRole('button', { name: `Measure ${label}` }).click();
			// Settled: the bands are drawn, or the page says the take or its analysis failed. The
			// wait is long because in a full run the worker may still hold earlier tests' jobs.
			const settled = page.getByTestId('band-times').or(page.getByText('The analysis failed'));
			const state = async () => (await page.locator('main').innerText()).slice(-600);
			await settled.first().waitFor({ timeout: 300_000 }).catch(async () => {
				throw new Error(`${label} was not analysed within 300 s; the page ends: ${await state()}`);
			});
			if (!(await page.getByTestId('band-times').isVisible())) throw new Error(`${label} did not end analysed: ${await state()}`);
			expect(await page.getByTestId('take-result').locator('h3').innerText()).toMatch(new RegExp(`^${label}: ${label}-measured-${REPETITIONS}x-`));
			const t30 = await page.getByTestId('band-row').locator('[data-metric="t30"]').allInnerTexts();
			expect(t30.filter((t) => /\d\.\d\d\u00a0s/.test(t)).length).toBeGreaterThanOrEqual(6);
			const result = page.getByTestId('take-result');
			const seconds = async (name: string) => Number(await result.getAttribute(name)) / 1000;
			steps.push({ label, atS: (Date.now() - started) / 1000, recordS: await seconds('data-record-ms'), alignS: await seconds('data-align-ms'), uploadS: await seconds('data-upload-ms') });
		}
		const totalS = (Date.now() - started) / 1000;
		const takeS = 0.5 + REPETITIONS * (SWEEP_S + SIGNAL.silenceS) + 1;
		console.log(
			`three-position browser measurement: ${SWEEP_S} s sweep + ${SIGNAL.silenceS} s silence, ${REPETITIONS} repetitions (${takeS.toFixed(1)} s of playing and recording per take): ` +
				`${steps.map((s) => `${s.label} analysed at ${s.atS.toFixed(1)} s (recorded ${s.recordS.toFixed(1)} s, aligned ${s.alignS.toFixed(2)} s, uploaded ${s.uploadS.toFixed(2)} s)`).join(', ')}; total ${totalS.toFixed(1)} s from opening the page`
		);
		// Three takes of playing cannot be quicker than their own length.
		expect(totalS).toBeGreaterThan(3 * takeS);
	}, 600_000);
});
