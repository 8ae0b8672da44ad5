import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Page } from 'playwright-core';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { decodeWav, encodeWav } from '../../src/lib/analysis';
import { analyseRecordingWithThirds } from '../../src/lib/analysis/with-thirds';
import { dbfsFromRms } from '../../src/lib/analysis/calibration';
import { launch, newPage, seen, signIn } from './browser';
import { repeatedRecording, syntheticImpulseResponse } from '../helpers/room-recording';
import { createTestSignal, newVisit, openMeasurePage, startAndCheckLevel } from './measure-steps';

// Measuring in the browser with Chromium's fake capture device, fed a WAV made from formulas:
// the stored test signal played three times back to back through a synthetic room (a direct
// sound and a white-noise tail of T = 0.5 s) with steady background noise. The page plays the
// signal to the fake output, records the fake input, finds each repetition by deconvolution,
// averages them and uploads the average; the worker analyses it like any other capture.
const ACOUSTICIAN = 'acoustician@fenwick-hale.test';
// The fake device runs at 44.1 kHz: a signal and a file at that rate reach the page unresampled.
const SR = 44_100;
const SIGNAL = { f1Hz: 20, f2Hz: 20_000, durationS: 2, silenceS: 1.5, sampleRate: SR };
const T60 = 0.5;
const NOISE_RMS = 1e-3; // −57 dBFS of background (AES17)
const REPETITIONS = 3;
const dir = mkdtempSync(join(tmpdir(), 'ringdown-measure-'));

let signalName: string;
let storedSweep: Float64Array;
let visitUrl: string;
let recording: ReturnType<typeof repeatedRecording>;
const browsers: Browser[] = [];
/** Chromium whose microphone hears the room. */
let roomBrowser: Browser;

beforeAll(async () => {
	// An ordinary browser makes the test signal and a visit of its own in the demo room.
	const setup = await launch();
	browsers.push(setup);
	const page = await newPage(setup);
	await signIn(page, ACOUSTICIAN);
	const signal = await createTestSignal(page, `Measure check ${Date.now()}`, SIGNAL);
	signalName = signal.name;
	storedSweep = decodeWav(new Uint8Array(await (await page.request.get(`/api/sweeps/${signal.id}/download`)).body())).samples;
	visitUrl = await newVisit(page, `browser measurement ${Date.now()}`);
	await setup.close();

	// What the microphone hears: 0.75 s of background, the stored signal three times through the
	// room, 2 s more; 16-bit PCM, as Chromium's fake device reads it.
	const room = syntheticImpulseResponse({ t60S: T60, directS: 0.004, tailDb: -30, lengthS: 1.4, seed: 21 }, SR);
	recording = repeatedRecording({ signal: storedSweep, ir: room, sampleRate: SR, repetitions: REPETITIONS, leadInS: 0.75, tailS: 2, gain: 0.2, noiseRms: NOISE_RMS, seed: 22 });
	writeFileSync(join(dir, 'room.wav'), encodeWav(recording.samples, SR, 16));
	// The same room eight times louder: its sweeps clip in the file.
	writeFileSync(join(dir, 'clipped.wav'), encodeWav(recording.samples.map((v) => 8 * v), SR, 16));
	roomBrowser = await launch({ fakeAudioCapture: `${join(dir, 'room.wav')}%noloop` });
	browsers.push(roomBrowser);
});

afterAll(async () => {
	for (const b of browsers) await b.close().catch(() => {});
});

interface BandJson {
	centerHz: number;
	t20S: number | null;
	t30S: number | null;
	peakToNoiseDb: number | null;
}

async function exportedBands(page: Page, captureId: number): Promise<{ bands: BandJson[]; broadband: BandJson }> {
	const res = await page.request.get(`/api/captures/${captureId}/export?format=json`);
	expect(res.status()).toBe(200);
	return res.json();
}

describe('measuring in the browser', () => {
	it('measures a known room: the capture’s T per band matches the recording analysed from the file, and three repetitions average', async () => {
		const page = await newPage(roomBrowser);
		await signIn(page, ACOUSTICIAN);
		await openMeasurePage(page, visitUrl);

		// The browser turned the voice processing off, as asked.
		const check = await startAndCheckLevel(page, signalName);
		const processing = page.getByTestId('input-processing').locator('li');
		expect(await processing.evaluateAll((items) => items.map((i) => i.getAttribute('data-state')))).toEqual(['off', 'off', 'off']);
		expect(await check.getAttribute('data-verdict')).toBe('good');

		// A new visit has no positions: the first take makes P1.
		await page.getByLabel('Repetitions').fill(String(REPETITIONS));
		await page.getByRole('button', { name: 'Measure P1' }).click();
		const result = page.getByTestId('take-result');
		await result.waitFor({ timeout: 90_000 });
		await page.getByTestId('band-times').waitFor({ timeout: 90_000 });
		const captureId = Number(await result.getAttribute('data-capture-id'));
		expect(captureId).toBeGreaterThan(0);
		expect(await result.getByTestId('take-repetitions').innerText()).toContain(`${REPETITIONS}, aligned and averaged`);

		// The repetitions were aligned to the sample: what differs between them is the background
		// we put in (a misalignment of one sample would leave the sweep itself in the difference).
		const noise = result.getByTestId('take-noise');
		const perRepetition = Number(await noise.getAttribute('data-per-repetition'));
		const averaged = Number(await noise.getAttribute('data-averaged'));
		expect(Math.abs(perRepetition - dbfsFromRms(NOISE_RMS))).toBeLessThan(0.5);
		expect(perRepetition - averaged).toBeCloseTo(10 * Math.log10(REPETITIONS), 6);

		// The same room as one file an acoustician would upload: the first repetition as recorded,
		// analysed by the engine with the stored sweep, as the worker analyses a capture.
		const single = decodeWav(encodeWav(recording.samples.slice(0, recording.firstStart + storedSweep.length), SR, 16)).samples;
		const fromFile = analyseRecordingWithThirds(encodeWav(single, SR, 16), { reference: storedSweep, sweep: { f1Hz: SIGNAL.f1Hz, f2Hz: SIGNAL.f2Hz, durationS: SIGNAL.durationS } });
		const measured = await exportedBands(page, captureId);
		const octaves = fromFile.bands.filter((b) => b.centerHz >= 63 && b.centerHz <= 8000);
		expect(octaves).toHaveLength(8);
		for (const band of octaves) {
			const m = measured.bands.find((b) => b.centerHz === band.centerHz);
			expect(m, `${band.centerHz} Hz`).toBeDefined();
			// Within ISO 3382-1:2009's just noticeable difference for reverberation, 5 % (Annex A, Table A.1).
			for (const key of ['t20S', 't30S'] as const) {
				expect(m![key], `${key} at ${band.centerHz} Hz`).not.toBeNull();
				expect(Math.abs(m![key]! / band[key]! - 1), `${key} at ${band.centerHz} Hz: ${m![key]} vs ${band[key]}`).toBeLessThan(0.05);
			}
		}
		// And both are the room's T of the formula, broadband (the tail is white, so every band's T is 0.5 s give or take its noise).
		expect(Math.abs(measured.broadband.t30S! / T60 - 1)).toBeLessThan(0.05);
		// Three repetitions leave a third of the noise power: the decay falls 10·lg 3 = 4.8 dB further before meeting it.
		const gainDb = measured.broadband.peakToNoiseDb! - fromFile.broadband.inrDb!;
		expect(gainDb).toBeGreaterThan(3.5);
		expect(gainDb).toBeLessThan(6);
		const worst = Math.max(...octaves.flatMap((b) => (['t20S', 't30S'] as const).map((k) => Math.abs(measured.bands.find((m) => m.centerHz === b.centerHz)![k]! / b[k]! - 1))));
		console.log(
			`browser take vs file, T30 per octave (s): ${octaves.map((b) => `${b.centerHz} Hz ${measured.bands.find((m) => m.centerHz === b.centerHz)!.t30S!.toFixed(3)}/${b.t30S!.toFixed(3)}`).join(', ')}; ` +
				`largest T20/T30 difference ${(worst * 100).toFixed(2)} %; INR ${fromFile.broadband.inrDb!.toFixed(1)} → ${measured.broadband.peakToNoiseDb!.toFixed(1)} dB; ` +
				`noise ${perRepetition.toFixed(2)} dBFS per repetition (put in ${dbfsFromRms(NOISE_RMS).toFixed(2)}) → ${averaged.toFixed(2)} dBFS averaged`
		);
		if (process.env.MEASURE_SCREENSHOTS) await page.screenshot({ path: join(process.env.MEASURE_SCREENSHOTS, 'measure-1280.png'), fullPage: true });

		// "Next position" keeps the settings and moves on to P2.
		await page.getByRole('button', { name: 'Next position' }).click();
		expect(await page.getByLabel("New position's label").inputValue()).toBe('P2');
		expect(await page.getByLabel('Repetitions').inputValue()).toBe(String(REPETITIONS));
		expect(await page.getByRole('combobox', { name: /^Test signal/ }).locator('option:checked').innerText()).toBe(signalName);
		expect(await page.getByTestId('level-check').getAttribute('data-verdict')).toBe('good');
		expect(await page.getByRole('button', { name: 'Measure P2' }).isEnabled()).toBe(true);

		// The visit page lists the capture, analysed.
		await page.goto(visitUrl);
		expect(await seen(page.getByTestId('capture-row').filter({ hasText: 'P1-measured-3x-' }))).toBe(true);
	}, 240_000);

	it('fits a phone: at 390 px the page scrolls only inside its tables', async () => {
		const page = await newPage(roomBrowser, { width: 390, height: 844 });
		await signIn(page, ACOUSTICIAN);
		await openMeasurePage(page, visitUrl);
		await startAndCheckLevel(page, signalName);
		await page.waitForTimeout(300);
		if (process.env.MEASURE_SCREENSHOTS) await page.screenshot({ path: join(process.env.MEASURE_SCREENSHOTS, 'measure-390.png'), fullPage: true });
		expect(await page.evaluate(() => document.documentElement.scrollWidth)).toBeLessThanOrEqual(390);
	}, 120_000);

	it('refuses to measure while the input clips', async () => {
		const browser = await launch({ fakeAudioCapture: `${join(dir, 'clipped.wav')}%noloop` });
		browsers.push(browser);
		const page = await newPage(browser);
		await signIn(page, ACOUSTICIAN);
		await openMeasurePage(page, visitUrl);
		const check = await startAndCheckLevel(page, signalName);
		expect(await check.getAttribute('data-verdict')).toBe('clipping');
		expect(await check.innerText()).toMatch(/The input clipped/);
		expect(await check.getByTestId('take-peak').innerText()).toMatch(/clipped \(\d+ runs? at full scale\)/);
		const measure = page.getByRole('button', { name: /^Measure / });
		expect(await measure.isDisabled()).toBe(true);
		expect(await page.getByTestId('measure-locked').innerText()).toMatch(/clipped/);
	}, 120_000);
});
