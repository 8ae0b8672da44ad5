/**
 * Speed of the analysis engine against the independent SciPy pipeline (tests/reference/pipeline.py,
 * Debian's /usr/bin/python3 with numpy and scipy), on the same files, in one run:
 *
 *   npx tsx scripts/bench-analysis.ts [--rounds N] [--only ir3-octave,ir3-third,ir10,sweep10] [--no-cli]
 *
 * Files: a 3 s, 48 kHz impulse response (octaves and thirds), a 10 s, 96 kHz impulse response and
 * a 10 s, 96 kHz recorded sweep analysed with its reference, written as 32-bit float WAV so both
 * sides read the same samples.
 *
 * 1. In-process, imports and file reading excluded on both sides, in CPU time (so the load of a
 *    shared machine counts less than in wall time): the first call in a fresh
 *    process (what a new worker or the command line pays) and the median of the next calls, each
 *    against SciPy's; the lower bound (one FFT of the file plus ten zero-phase band passes in
 *    numpy/scipy) beside it; the engine's peak memory beyond the decoded file, in bytes per sample.
 *    The engine is timed as the worker runs it (with chart curves) and as the command line does
 *    (without), each in its own fresh process, and once more with curves after the worker's
 *    warm-up (what a worker's first capture costs).
 * 2. Whole process: `npx tsx scripts/analyze.ts …` against `python3 tests/reference/pipeline.py …`,
 *    CPU time (user + system) and wall time.
 * Engine and SciPy runs alternate, and each ratio is the median over the rounds of the pairs, so a
 * change of machine load hits both sides. The load average is printed: others may share the machine.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { loadavg, tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

const PYTHON = '/usr/bin/python3';
const root = fileURLToPath(new URL('../', import.meta.url));
const pipeline = join(root, 'tests/reference/pipeline.py');
const tsx = join(root, 'node_modules/.bin/tsx');
const self = fileURLToPath(import.meta.url);

interface Case {
	id: string;
	label: string;
	file: string;
	bands: 'octave' | 'third';
	reference?: string;
	goals: { cold: number; warm: number; cli: number };
}

interface EngineTiming {
	coldMs: number;
	warmMs: number;
	bytesPerSample: number;
	samples: number;
}

interface ScipyTiming {
	coldMs: number;
	warmMs: number;
	lowerBoundMs: number;
}

const WARM_RUNS = 4;

function median(values: number[]): number {
	const sorted = [...values].sort((a, b) => a - b);
	const middle = Math.floor(sorted.length / 2);
	return sorted.length % 2 ? sorted[middle] : (sorted[middle - 1] + sorted[middle]) / 2;
}

const load = () => loadavg().map((v) => v.toFixed(2)).join(' ');

async function writeInputs(directory: string): Promise<Case[]> {
	const { encodeWav } = await import('../src/lib/analysis/wav');
	const { convolve, exponentialNoiseDecay } = await import('../src/lib/analysis/synthetic');
	const { generateExponentialSweep } = await import('../src/lib/analysis/sweep');
	const write = (name: string, samples: Float64Array, sampleRate: number) => {
		const path = join(directory, name);
		writeFileSync(path, encodeWav(samples, sampleRate, '32f'));
		return path;
	};
	const ir = (durationS: number, sampleRate: number, seed: number) => {
		const x = exponentialNoiseDecay({ t60S: 0.8, durationS, sampleRate, onsetS: 0.01, noiseDbRePeak: -75, seed }).map((v) => 0.2 * v);
		x[Math.round(0.01 * sampleRate)] += 0.9;
		return x;
	};
	const ir3 = write('ir-3s-48k.wav', ir(3, 48000, 1), 48000);
	const ir10 = write('ir-10s-96k.wav', ir(10, 96000, 3), 96000);

	// A recorded sweep: an 8 s sweep through a room, 10 s recorded (convolution by FFT, setup only).
	const sampleRate = 96000;
	const sweep = generateExponentialSweep({ f1Hz: 20, f2Hz: 20000, durationS: 8, sampleRate, fadeInS: 0.1, fadeOutS: 0.02, amplitude: 0.5 });
	const room = exponentialNoiseDecay({ t60S: 0.6, durationS: 1.5, sampleRate, onsetS: 0.003, seed: 2 }).map((v) => 0.02 * v);
	room[288] += 0.5;
	const recorded = convolve(sweep.samples, room, 10 * sampleRate);
	// A little background noise, as in a real recording.
	let state = 7;
	for (let i = 0; i < recorded.length; i++) {
		state = (state * 1103515245 + 12345) % 2147483648;
		recorded[i] += 1e-5 * (state / 2147483648 - 0.5);
	}
	const sweepRecording = write('sweep-recorded-10s-96k.wav', recorded.subarray(0, 10 * sampleRate), sampleRate);
	const sweepReference = write('sweep-8s-96k.wav', sweep.samples, sampleRate);
	return [
		{ id: 'ir3-octave', label: '3 s 48 kHz IR, octaves', file: ir3, bands: 'octave', goals: { cold: 0.3, warm: 0.2, cli: 0.75 } },
		{ id: 'ir3-third', label: '3 s 48 kHz IR, thirds', file: ir3, bands: 'third', goals: { cold: 0.3, warm: 0.2, cli: 0.75 } },
		{ id: 'ir10', label: '10 s 96 kHz IR, octaves', file: ir10, bands: 'octave', goals: { cold: 0.3, warm: 0.2, cli: 0.6 } },
		{
			id: 'sweep10',
			label: '10 s 96 kHz sweep, octaves',
			file: sweepRecording,
			bands: 'octave',
			reference: sweepReference,
			goals: { cold: 0.3, warm: 0.2, cli: 0.75 }
		}
	];
}

/** CPU milliseconds (all threads of this process) of `work`. */
function cpuMs(work: () => void): number {
	const before = process.cpuUsage();
	work();
	const used = process.cpuUsage(before);
	return (used.user + used.system) / 1000;
}

/**
 * Child process: one fresh engine, timed on its first call and on the next ones, with or without
 * curves; `warmed`: after the worker's warm-up (src/lib/server/jobs/warm-up.ts), as a worker's first capture.
 */
async function engineChild(file: string, bands: 'octave' | 'third', curves: boolean, reference: string | undefined, warmed = false): Promise<void> {
	const { analyseDecodedRecording } = await import('../src/lib/analysis/analyse');
	const { decodeWav } = await import('../src/lib/analysis/wav');
	if (warmed) (await import('../src/lib/server/jobs/warm-up')).warmUpEngine();
	// Decoding is left out of the time, as SciPy's file reading is.
	const decoded = decodeWav(readFileSync(file));
	const played = reference ? decodeWav(readFileSync(reference)) : null;
	const samples = decoded.samples.length;
	const rssBefore = process.memoryUsage().rss;
	const timed = () =>
		cpuMs(() => analyseDecodedRecording(decoded, { bands, curves, reference: played?.samples, referenceSampleRate: played?.sampleRate }));
	const coldMs = timed();
	const peakRss = process.resourceUsage().maxRSS * 1024;
	const warm = Array.from({ length: WARM_RUNS }, timed);
	const result: EngineTiming = {
		coldMs,
		warmMs: median(warm),
		// The file's own samples (8 bytes each, decoded) are in rssBefore.
		bytesPerSample: Math.max(0, peakRss - rssBefore) / samples,
		samples
	};
	process.stdout.write(JSON.stringify(result));
}

/** Engine timing in a fresh process (the first call of that process is the cold one). */
function engineInProcess(c: Case, curves: boolean, warmed = false): EngineTiming {
	const mode = warmed ? 'warmed' : curves ? 'curves' : 'plain';
	const args = ['--import', 'tsx', self, '--engine-child', c.file, c.bands, mode, ...(c.reference ? [c.reference] : [])];
	const child = spawnSync(process.execPath, args, { cwd: root, encoding: 'utf8', maxBuffer: 1 << 20 });
	if (child.status !== 0) throw new Error(`engine child failed: ${child.stderr}`);
	return JSON.parse(child.stdout) as EngineTiming;
}

function scipyInProcess(c: Case): ScipyTiming {
	const args = [pipeline, '--bench', c.file, '--bands', c.bands, '--runs', String(WARM_RUNS), ...(c.reference ? ['--reference', c.reference] : [])];
	const child = spawnSync(PYTHON, args, { encoding: 'utf8' });
	if (child.status !== 0) throw new Error(`SciPy pipeline failed (needs ${PYTHON} with python3-scipy): ${child.stderr}`);
	return JSON.parse(child.stdout) as ScipyTiming;
}

/** Whole process under /usr/bin/time: wall and CPU seconds (children included). */
function wholeProcess(command: string[]): { wallS: number; cpuS: number } {
	const child = spawnSync('/usr/bin/time', ['-f', '%e %U %S', ...command], { cwd: root, encoding: 'utf8', maxBuffer: 16 << 20 });
	if (child.status !== 0) throw new Error(`${command.join(' ')} failed: ${child.stderr}`);
	const [wall, user, system] = child.stderr.trim().split('\n').pop()!.split(' ').map(Number);
	return { wallS: wall, cpuS: user + system };
}

const cliEngine = (c: Case) => ['npx', 'tsx', 'scripts/analyze.ts', c.file, '--bands', c.bands, ...(c.reference ? ['--reference', c.reference] : [])];
const cliScipy = (c: Case) => [PYTHON, pipeline, c.file, '--bands', c.bands, ...(c.reference ? ['--reference', c.reference] : [])];

const ratio = (value: number) => `${value.toFixed(2)}×`;
const mark = (value: number, goal: number) => `${ratio(value)} ${value <= goal ? 'ok' : `(goal ≤ ${goal}×)`}`;

async function main(argv: string[]): Promise<void> {
	const option = (name: string) => {
		const i = argv.indexOf(name);
		return i >= 0 ? argv[i + 1] : undefined;
	};
	const rounds = Number(option('--rounds') ?? 3);
	const only = option('--only')?.split(',');
	const cases = (await writeInputs(mkdtempSync(join(tmpdir(), 'ringdown-bench-'))))
		.filter((c) => !only || only.includes(c.id));
	console.log(`engine vs SciPy (${PYTHON}), ${rounds} interleaved rounds; load average at start ${load()} (1, 5, 15 min)`);

	for (const c of cases) {
		const runs: { engine: EngineTiming; plain: EngineTiming; warmed: EngineTiming; scipy: ScipyTiming }[] = [];
		for (let round = 0; round < rounds; round++) {
			const scipy = scipyInProcess(c);
			const engine = engineInProcess(c, true);
			const plain = engineInProcess(c, false);
			const warmed = engineInProcess(c, true, true);
			runs.push({ engine, plain, warmed, scipy });
		}
		const m = (f: (pair: (typeof runs)[number]) => number) => median(runs.map(f));
		console.log(`\n${c.label} (${runs[0].engine.samples} samples)`);
		console.log(
			`  in-process CPU, with curves (the worker): first ${m((p) => p.engine.coldMs).toFixed(0)} ms, then ${m((p) => p.engine.warmMs).toFixed(0)} ms;` +
				` SciPy first ${m((p) => p.scipy.coldMs).toFixed(0)} ms, then ${m((p) => p.scipy.warmMs).toFixed(0)} ms`
		);
		console.log(
			`    ratio first ${mark(m((p) => p.engine.coldMs / p.scipy.coldMs), c.goals.cold)}, warm ${mark(m((p) => p.engine.warmMs / p.scipy.warmMs), c.goals.warm)};` +
				` first call / lower bound (${m((p) => p.scipy.lowerBoundMs).toFixed(0)} ms) ${mark(m((p) => p.engine.coldMs / p.scipy.lowerBoundMs), 4)}`
		);
		console.log(
			`    a worker's first capture (after its warm-up at start): ${m((p) => p.warmed.coldMs).toFixed(0)} ms, ratio to SciPy's first call ${mark(m((p) => p.warmed.coldMs / p.scipy.coldMs), c.goals.cold)}`
		);
		console.log(
			`  in-process CPU, no curves (the command line): first ${m((p) => p.plain.coldMs).toFixed(0)} ms, then ${m((p) => p.plain.warmMs).toFixed(0)} ms;` +
				` ratio first ${mark(m((p) => p.plain.coldMs / p.scipy.coldMs), c.goals.cold)}, warm ${mark(m((p) => p.plain.warmMs / p.scipy.warmMs), c.goals.warm)};` +
				` first / lower bound ${mark(m((p) => p.plain.coldMs / p.scipy.lowerBoundMs), 4)}`
		);
		console.log(
			`  peak memory beyond the decoded file: ${m((p) => p.engine.bytesPerSample).toFixed(1)} bytes per sample with curves, ${m((p) => p.plain.bytesPerSample).toFixed(1)} without (goal ≤ 20)`
		);
		if (!argv.includes('--no-cli')) {
			const cli: { engine: ReturnType<typeof wholeProcess>; scipy: ReturnType<typeof wholeProcess> }[] = [];
			for (let round = 0; round < rounds; round++) cli.push({ scipy: wholeProcess(cliScipy(c)), engine: wholeProcess(cliEngine(c)) });
			const n = (f: (pair: (typeof cli)[number]) => number) => median(cli.map(f));
			console.log(
				`  command line, whole process: CPU ${n((p) => p.engine.cpuS).toFixed(2)} s vs SciPy ${n((p) => p.scipy.cpuS).toFixed(2)} s, ratio ${mark(n((p) => p.engine.cpuS / p.scipy.cpuS), c.goals.cli)};` +
					` wall ${n((p) => p.engine.wallS).toFixed(2)} s vs ${n((p) => p.scipy.wallS).toFixed(2)} s, ratio ${ratio(n((p) => p.engine.wallS / p.scipy.wallS))}`
			);
		}
		console.log(`  load average now ${load()}`);
	}
}

const argv = process.argv.slice(2);
if (argv[0] === '--engine-child') {
	await engineChild(argv[1], argv[2] as 'octave' | 'third', argv[3] !== 'plain', argv[4], argv[3] === 'warmed');
} else {
	await main(argv);
}
