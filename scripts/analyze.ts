/**
 * Command-line analysis of one WAV file; prints one JSON object on stdout.
 *
 *   npx tsx scripts/analyze.ts <file.wav> [--bands octave|third] [--reference <sweep.wav>] [--channel N] [--curves]
 *
 * --reference: the file is a recorded sweep and <sweep.wav> the sweep that was played.
 * --curves: also print the chart curves (as stored for the portal) under `curves`, after the
 * figures; without it they are not computed, which saves most of the time on a short file.
 * --channel: 0-based channel of the file. Untrusted values are null, with a warning saying why.
 * inrDb (also under its earlier name peakToNoiseDb): the impulse response-to-noise ratio behind the
 * T20/T30 requirements; broadband values are those of the span of the bands.
 * On bad input: exit code 1, one line on stderr, nothing on stdout.
 */
import { readFileSync } from 'node:fs';
import type { BandKind } from '../src/lib/analysis/bands';
import { AnalysisInputError } from '../src/lib/analysis/errors';
import type { AnalysisResult, BandMetrics } from '../src/lib/analysis/types';

interface CliArguments {
	file: string;
	bands: BandKind;
	reference: string | null;
	channel: number;
	curves: boolean;
}

class UsageError extends Error {}

const USAGE = 'usage: analyze.ts <file.wav> [--bands octave|third] [--reference <sweep.wav>] [--channel N] [--curves]';

function parseArguments(argv: string[]): CliArguments {
	let file: string | null = null;
	let bands: BandKind = 'octave';
	let reference: string | null = null;
	let channel = 0;
	let curves = false;
	for (let i = 0; i < argv.length; i++) {
		const argument = argv[i];
		const value = () => {
			const next = argv[++i];
			if (next === undefined || next.startsWith('--')) throw new UsageError(`${argument} needs a value — ${USAGE}`);
			return next;
		};
		if (argument === '--bands') {
			const kind = value();
			if (kind !== 'octave' && kind !== 'third') throw new UsageError(`--bands must be octave or third, got "${kind}"`);
			bands = kind;
		} else if (argument === '--reference') {
			reference = value();
		} else if (argument === '--channel') {
			const text = value();
			if (!/^\d+$/.test(text)) throw new UsageError(`--channel must be a whole number ≥ 0 (0-based), got "${text}"`);
			channel = Number(text);
		} else if (argument === '--curves') {
			curves = true;
		} else if (argument.startsWith('--')) {
			throw new UsageError(`unknown option ${argument} — ${USAGE}`);
		} else if (file === null) {
			file = argument;
		} else {
			throw new UsageError(`only one WAV file can be analysed, got "${file}" and "${argument}"`);
		}
	}
	if (file === null) throw new UsageError(`no WAV file given — ${USAGE}`);
	return { file, bands, reference, channel, curves };
}

function readInput(path: string): Uint8Array {
	try {
		return readFileSync(path);
	} catch (error) {
		const code = (error as NodeJS.ErrnoException).code;
		const reason = code === 'ENOENT' ? 'no such file' : code === 'EISDIR' ? 'it is a directory' : (error as Error).message;
		throw new UsageError(`cannot read ${path}: ${reason}`);
	}
}

const round = (value: number | null, decimals: number): number | null =>
	value === null ? null : Math.round(value * 10 ** decimals) / 10 ** decimals;

/** Seconds to 3 decimals, dB to 2, D50 to 3, centre time to 0.1 ms. */
function metrics(band: BandMetrics) {
	return {
		edtS: round(band.edtS, 3),
		t20S: round(band.t20S, 3),
		t30S: round(band.t30S, 3),
		c50Db: round(band.c50Db, 2),
		c80Db: round(band.c80Db, 2),
		d50: round(band.d50, 3),
		tsMs: round(band.tsMs, 1),
		inrDb: round(band.inrDb ?? null, 2)
	};
}

function summary(result: AnalysisResult) {
	return {
		sampleRate: result.sampleRate,
		channels: result.channels,
		durationS: round(result.durationS, 3),
		// The INR (impulse response-to-noise ratio) under its earlier name; inrDb below is the same figure.
		peakToNoiseDb: round(result.peakToNoiseDb, 2),
		directSoundS: round(result.directSoundS, 4),
		broadband: metrics(result.broadband),
		bands: result.bands.map((band) => ({ centerHz: band.centerHz, ...metrics(band) })),
		reflections: result.reflections.map((reflection) => ({
			delayMs: round(reflection.delayMs, 2),
			levelDb: round(reflection.levelDb, 2),
			aboveDiffuseDb: round(reflection.aboveDiffuseDb ?? null, 2)
		})),
		warnings: result.warnings.map((warning) => warning.message),
		inrDb: round(result.inrDb ?? null, 2),
		directToReverberantDb: round(result.quality.directToReverberantDb ?? null, 2)
	};
}

async function main(): Promise<void> {
	const args = parseArguments(process.argv.slice(2));
	const bytes = readInput(args.file);
	const referenceBytes = args.reference === null ? null : readInput(args.reference);
	// Loaded once the arguments are known good: a usage error answers without loading the engine.
	const [{ analyseRecording }, { decodeWav }] = await Promise.all([import('../src/lib/analysis/analyse'), import('../src/lib/analysis/wav')]);
	const played = referenceBytes === null ? null : decodeWav(referenceBytes);
	const result = analyseRecording(bytes, {
		bands: args.bands,
		channel: args.channel,
		reference: played?.samples,
		referenceSampleRate: played?.sampleRate,
		curves: args.curves
	});
	const output = args.curves ? { ...summary(result), curves: result.curves } : summary(result);
	process.stdout.write(`${JSON.stringify(output)}\n`);
}

try {
	await main();
} catch (error) {
	const message = error instanceof UsageError || error instanceof AnalysisInputError ? error.message : `analysis failed: ${(error as Error).message}`;
	process.stderr.write(`${message.replace(/\s*\n\s*/g, ' ')}\n`);
	process.exitCode = 1;
}
