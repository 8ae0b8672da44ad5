/**
 * Time and memory of the analysis engine on one core.
 *
 *   npx tsx scripts/bench-analysis.ts
 *
 * 1. a 3 s, 48 kHz impulse response, whole analysis, octave and one-third-octave bands (target < 150 ms);
 * 2. a 10 s, 96 kHz stereo recorded sweep: decode, deconvolution and analysis (target < 1.5 s, < 300 MB),
 *    run in a child process that only reads the file, so its peak memory is the analysis's own.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyseImpulseResponse, analyseRecording } from '../src/lib/analysis/analyse';
import { RealFftPlan, fftSizeFor } from '../src/lib/analysis/fft';
import { generateExponentialSweep } from '../src/lib/analysis/sweep';
import { exponentialNoiseDecay } from '../src/lib/analysis/synthetic';
import type { AnalysisStage } from '../src/lib/analysis/types';
import { decodeWav, encodeWav } from '../src/lib/analysis/wav';

type Stages = Partial<Record<AnalysisStage, number>>;

const megabytes = (bytes: number) => `${(bytes / 1024 / 1024).toFixed(0)} MB`;

function memoryLine(): string {
	const { rss, heapUsed } = process.memoryUsage();
	// maxRSS is in kilobytes.
	return `rss ${megabytes(rss)}, heap ${megabytes(heapUsed)}, peak rss ${megabytes(process.resourceUsage().maxRSS * 1024)}`;
}

function stagesLine(stages: Stages): string {
	return Object.entries(stages)
		.map(([stage, ms]) => `${stage} ${ms!.toFixed(1)}`)
		.join(', ');
}

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	return sorted[Math.floor(sorted.length / 2)];
}

function impulseResponseCase(): void {
	const sampleRate = 48000;
	const ir = exponentialNoiseDecay({ t60S: 0.8, durationS: 3, sampleRate, onsetS: 0.01, noiseDbRePeak: -75, seed: 1 }).map((v) => 0.2 * v);
	ir[480] += 1;
	for (const bands of ['octave', 'third'] as const) {
		const times: number[] = [];
		let stages: Stages = {};
		for (let run = 0; run < 7; run++) {
			const current: Stages = {};
			const started = performance.now();
			analyseImpulseResponse(ir, sampleRate, { bands, onStage: (stage, ms) => (current[stage] = ms) });
			times.push(performance.now() - started);
			stages = current;
		}
		console.log(
			`3 s @ 48 kHz IR, ${bands.padEnd(6)}: first ${times[0].toFixed(0)} ms, median of the next ${times.length - 1} ${median(times.slice(1)).toFixed(0)} ms (target < 150 ms)`
		);
		console.log(`    stages (ms, last run): ${stagesLine(stages)}`);
	}
	console.log(`    memory: ${memoryLine()}`);
}

/** Linear convolution by FFT (setup only, not timed). */
function convolve(a: Float64Array, b: Float64Array): Float64Array {
	const plan = new RealFftPlan(fftSizeFor(a.length + b.length));
	const A = new Float64Array(plan.size + 2);
	const B = new Float64Array(plan.size + 2);
	plan.forward(a, A);
	plan.forward(b, B);
	for (let k = 0; k <= plan.size / 2; k++) {
		const re = A[2 * k] * B[2 * k] - A[2 * k + 1] * B[2 * k + 1];
		A[2 * k + 1] = A[2 * k] * B[2 * k + 1] + A[2 * k + 1] * B[2 * k];
		A[2 * k] = re;
	}
	const out = new Float64Array(plan.size);
	plan.inverse(A, out);
	return out;
}

function writeSweepInputs(directory: string): { recording: string; reference: string } {
	const sampleRate = 96000;
	const sweep = generateExponentialSweep({ f1Hz: 20, f2Hz: 20000, durationS: 8, sampleRate, fadeInS: 0.1, fadeOutS: 0.02, amplitude: 0.5 });
	const room = exponentialNoiseDecay({ t60S: 0.6, durationS: 1.5, sampleRate, onsetS: 0.003, seed: 2 }).map((v) => 0.02 * v);
	room[288] += 0.5;
	const frames = 10 * sampleRate;
	const left = convolve(sweep.samples, room).slice(0, frames);
	const right = left.map((v, i) => 0.8 * v + (i > 100 ? 0.1 * left[i - 100] : 0));
	const recording = join(directory, 'recorded-sweep-96k-stereo.wav');
	const reference = join(directory, 'sweep-96k.wav');
	writeFileSync(recording, encodeWav([left, right], sampleRate, 24));
	writeFileSync(reference, encodeWav(sweep.samples, sampleRate, '32f'));
	return { recording, reference };
}

/** Child process: decode the reference outside the timing, then time the whole recording analysis. */
function sweepCaseChild(recordingPath: string, referencePath: string): void {
	const reference = decodeWav(readFileSync(referencePath)).samples;
	const bytes = readFileSync(recordingPath);
	const before = memoryLine();
	const stages: Stages = {};
	const started = performance.now();
	const result = analyseRecording(bytes, {
		channel: 1,
		reference,
		onStage: (stage, ms) => (stages[stage] = ms)
	});
	const elapsed = performance.now() - started;
	console.log(`10 s @ 96 kHz stereo recorded sweep: ${elapsed.toFixed(0)} ms (target < 1.5 s), T30 broadband ${result.broadband.t30S?.toFixed(3)} s`);
	console.log(`    stages (ms): ${stagesLine(stages)}`);
	console.log(`    memory before: ${before}`);
	console.log(`    memory after:  ${memoryLine()} (target peak < 300 MB)`);
}

const [mode, recordingPath, referencePath] = process.argv.slice(2);
if (mode === '--sweep-child') {
	sweepCaseChild(recordingPath, referencePath);
} else {
	impulseResponseCase();
	const inputs = writeSweepInputs(mkdtempSync(join(tmpdir(), 'ringdown-bench-')));
	const self = fileURLToPath(import.meta.url);
	const child = spawnSync(process.execPath, ['--import', 'tsx', self, '--sweep-child', inputs.recording, inputs.reference], {
		encoding: 'utf8',
		stdio: ['ignore', 'pipe', 'inherit']
	});
	process.stdout.write(child.stdout);
	if (child.status !== 0) process.exitCode = 1;
}
