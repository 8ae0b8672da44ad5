import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const root = fileURLToPath(new URL('../../../', import.meta.url));
const fixture = (name: string) => join(root, 'fixtures', name);
const tsx = join(root, 'node_modules', '.bin', 'tsx');

function run(...args: string[]) {
	const result = spawnSync(tsx, ['scripts/analyze.ts', ...args], { cwd: root, encoding: 'utf8', timeout: 60_000 });
	return { status: result.status, stdout: result.stdout, stderr: result.stderr };
}

interface CliMetrics {
	edtS: number | null;
	t20S: number | null;
	t30S: number | null;
	c50Db: number | null;
	c80Db: number | null;
	d50: number | null;
	tsMs: number | null;
}
interface CliOutput {
	sampleRate: number;
	channels: number;
	durationS: number;
	peakToNoiseDb: number | null;
	directSoundS: number;
	broadband: CliMetrics;
	bands: (CliMetrics & { centerHz: number })[];
	reflections: { delayMs: number; levelDb: number }[];
	warnings: string[];
}

function decimals(value: number): number {
	const text = String(value);
	return text.includes('.') ? text.split('.')[1].length : 0;
}

/** The contract: these keys, in this order, are always there; later engines may add more after them. */
function expectKeys(value: object, required: string[]): void {
	const keys = Object.keys(value);
	expect(keys.filter((key) => required.includes(key))).toEqual(required);
}

function expectContract(output: CliOutput): void {
	expectKeys(output, ['sampleRate', 'channels', 'durationS', 'peakToNoiseDb', 'directSoundS', 'broadband', 'bands', 'reflections', 'warnings']);
	const metricKeys = ['edtS', 't20S', 't30S', 'c50Db', 'c80Db', 'd50', 'tsMs'];
	expectKeys(output.broadband, metricKeys);
	for (const band of output.bands) {
		expectKeys(band, ['centerHz', ...metricKeys]);
		for (const key of ['edtS', 't20S', 't30S', 'd50'] as const) if (band[key] !== null) expect(decimals(band[key]!)).toBeLessThanOrEqual(3);
		for (const key of ['c50Db', 'c80Db'] as const) if (band[key] !== null) expect(decimals(band[key]!)).toBeLessThanOrEqual(2);
	}
	for (const reflection of output.reflections) expectKeys(reflection, ['delayMs', 'levelDb']);
	expect(output.warnings.every((w) => typeof w === 'string')).toBe(true);
	// Added in engine 1.1: the INR, the same figure as peakToNoiseDb.
	expect((output as CliOutput & { inrDb: number | null }).inrDb).toBe(output.peakToNoiseDb);
}

describe('scripts/analyze.ts', () => {
	it('an impulse response: octave bands 63–8000 by default, values of the fixture (T = 0.5 s by construction)', () => {
		const { status, stdout, stderr } = run(fixture('decay-t0.5-48k.wav'));
		expect(stderr).toBe('');
		expect(status).toBe(0);
		expect(stdout.trim().split('\n')).toHaveLength(1);
		const output = JSON.parse(stdout) as CliOutput;
		expectContract(output);
		expect(output).toMatchObject({ sampleRate: 48000, channels: 1, durationS: 1 });
		expect(output.bands.map((b) => b.centerHz)).toEqual([63, 125, 250, 500, 1000, 2000, 4000, 8000]);
		// ISO 3382-1 Annex A JND: 5 %.
		for (const band of output.bands) expect(Math.abs(band.t30S! / 0.5 - 1)).toBeLessThan(0.05);
		expect(output.directSoundS).toBeCloseTo(0.01, 3);
	});

	it('--bands third gives the 24 thirds 50 Hz – 10 kHz', () => {
		const output = JSON.parse(run(fixture('decay-t0.5-48k.wav'), '--bands', 'third').stdout) as CliOutput;
		expectContract(output);
		expect(output.bands).toHaveLength(24);
		expect(output.bands[0].centerHz).toBe(50);
		expect(output.bands[23].centerHz).toBe(10000);
	});

	it.each([
		{ channel: '0', t60S: 0.3 },
		{ channel: '1', t60S: 0.6 }
	])('--channel $channel analyses that channel (T = $t60S s by construction)', ({ channel, t60S }) => {
		const output = JSON.parse(run(fixture('stereo-t0.3-t0.6-48k.wav'), '--channel', channel).stdout) as CliOutput;
		expect(output.channels).toBe(2);
		expect(Math.abs(output.broadband.t30S! / t60S - 1)).toBeLessThan(0.05);
	});

	it('--reference deconvolves a recorded sweep first (fixture room: reflection 3 ms after the direct sound at −6 dB, T = 0.4 s)', () => {
		const { status, stdout } = run(fixture('sweep-recorded-48k.wav'), '--reference', fixture('sweep-1s-48k.wav'));
		expect(status).toBe(0);
		const output = JSON.parse(stdout) as CliOutput;
		expectContract(output);
		expect(Math.abs(output.broadband.t30S! / 0.4 - 1)).toBeLessThan(0.05);
		const reflection = output.reflections.find((r) => Math.abs(r.delayMs - 3) < 0.05);
		expect(reflection).toBeDefined();
		// 20·lg 0.5 = −6.02 dB; 1 dB for the envelope of a band-limited pulse.
		expect(Math.abs(reflection!.levelDb + 6.02)).toBeLessThan(1);
	});

	it('the measured living room (OpenAIR, Domestic Living Room, Public Domain): 44.1 kHz, T30 per octave as python-acoustics gives it', () => {
		const output = JSON.parse(run(fixture('living_room_1.wav')).stdout) as CliOutput;
		expectContract(output);
		expect(output.sampleRate).toBe(44100);
		// T30 per octave 63 Hz – 8 kHz from python-acoustics' test suite for this file; within the
		// 5 % just-noticeable difference of ISO 3382-1:2009 Annex A (from memory).
		const theirT30 = [0.274, 0.365, 0.303, 0.259, 0.227, 0.211, 0.204, 0.181];
		expect(output.bands.map((b) => b.centerHz)).toEqual([63, 125, 250, 500, 1000, 2000, 4000, 8000]);
		output.bands.forEach((band, i) => expect(Math.abs(band.t30S! / theirT30[i] - 1), `${band.centerHz} Hz: ${band.t30S} s`).toBeLessThan(0.05));
	});

	const scratch = mkdtempSync(join(tmpdir(), 'ringdown-cli-'));
	const notWav = join(scratch, 'notes.wav');
	writeFileSync(notWav, 'these are notes, not audio');

	it('--curves adds the chart curves the engine stores for the portal; without it there are none', async () => {
		const { analyseRecording } = await import('../../../src/lib/analysis/analyse');
		const plain = JSON.parse(run(fixture('decay-t0.5-48k.wav')).stdout);
		expect(plain).not.toHaveProperty('curves');
		const { status, stdout } = run(fixture('decay-t0.5-48k.wav'), '--curves');
		expect(status).toBe(0);
		const withCurves = JSON.parse(stdout);
		const { curves, ...figures } = withCurves;
		expect(figures).toEqual(plain);
		const stored = JSON.parse(JSON.stringify(analyseRecording(readFileSync(fixture('decay-t0.5-48k.wav'))).curves));
		expect(curves).toEqual(stored);
		expect(curves.decay).toHaveLength(9); // broadband and the 8 octaves
		expect(curves.waterfall.levelsDb.length).toBeGreaterThan(1);
	}, 60_000);

	it.each([
		{ label: 'a missing file', args: [join(scratch, 'missing.wav')], pattern: /cannot read .*missing\.wav: no such file/ },
		{ label: 'no file at all', args: [], pattern: /no WAV file given/ },
		{ label: 'a file that is not a WAV', args: [notWav], pattern: /not a WAV file/ },
		{ label: 'an unknown flag', args: [fixture('decay-t0.5-48k.wav'), '--bogus'], pattern: /unknown option --bogus/ },
		{ label: 'a bad band kind', args: [fixture('decay-t0.5-48k.wav'), '--bands', 'fifth'], pattern: /--bands must be octave or third/ },
		{ label: 'a negative channel', args: [fixture('decay-t0.5-48k.wav'), '--channel', '-1'], pattern: /--channel/ },
		{ label: 'a channel the file lacks', args: [fixture('decay-t0.5-48k.wav'), '--channel', '3'], pattern: /channel 3 does not exist/ },
		{ label: 'a flag without its value', args: [fixture('decay-t0.5-48k.wav'), '--reference'], pattern: /--reference needs a value/ },
		{ label: 'a missing reference', args: [fixture('decay-t0.5-48k.wav'), '--reference', join(scratch, 'none.wav')], pattern: /cannot read/ }
	])('$label: non-zero exit, one line on stderr, nothing on stdout', ({ args, pattern }) => {
		const { status, stdout, stderr } = run(...args);
		expect(status).not.toBe(0);
		expect(stdout).toBe('');
		expect(stderr.endsWith('\n')).toBe(true);
		expect(stderr.trimEnd().split('\n')).toHaveLength(1);
		expect(stderr).toMatch(pattern);
		expect(stderr).not.toMatch(/\bat .*\.ts:\d+/); // no stack trace
	});
});
