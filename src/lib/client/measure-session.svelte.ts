// One sitting of measuring in the browser: the test signal loaded from the practice's stored WAV,
// the level check, and takes — play and record, align and average the repetitions, then upload
// the average as a recorded sweep of that test signal through the same pipeline as a picked file.
import { decodeWav, encodeWav } from '$lib/analysis';
import { levelVerdict, type LevelVerdict } from '$lib/measure/levels';
import { takeFilename } from '$lib/measure/positions';
import { analyseTake, requiredLength, TakeError, takeRefusal, type TakePlan, type TakeResult } from '$lib/measure/take';
import { AudioRig, type PlayOn } from './audio-rig.svelte';
import { UploadQueue } from './upload-queue.svelte';
import type { MeasureSignal } from '$lib/types/measure';

/** What loading a signal needs of its definition. */
export type SignalDefinition = Omit<MeasureSignal, 'levelDbfs'>;

export interface LoadedSignal {
	definition: SignalDefinition;
	/** The stored WAV's samples: the sweep, then its silence. */
	samples: Float64Array;
	sweepSamples: number;
}

/** What the page shows of a take (the averaged samples stay out of the page's state). */
export type TakeSummary = Omit<TakeResult, 'average'> & { repetitions: number };

export interface TakeSettings {
	repetitions: number;
	/** Input channel of the measurement microphone. */
	channel: number;
	/** Input channel that hears the output directly, or null. */
	loopback: number | null;
	playOn: PlayOn;
}

export type Phase = 'idle' | 'checking' | 'recording' | 'aligning' | 'uploading' | 'uploaded' | 'refused' | 'failed';

export interface UploadTarget {
	sessionId: number;
	/** "id:12" for an existing position or "new:P4". */
	position: string;
	positionLabel: string;
	positions: { id: number; label: string }[];
}

function summarise(result: TakeResult, repetitions: number): TakeSummary {
	const { average: _average, ...rest } = result;
	return { ...rest, repetitions };
}

/** Let the page paint a new state before a long computation on this thread. */
const nextPaint = () => new Promise<void>((resolve) => requestAnimationFrame(() => setTimeout(resolve, 0)));

export class MeasureSession {
	readonly rig = new AudioRig();
	signal = $state<LoadedSignal | null>(null);
	loadingSignal = $state(false);
	phase = $state<Phase>('idle');
	progress = $state(0);
	message = $state<string | null>(null);
	/** The last level check, and the settings it was made with. */
	levelCheck = $state<{ key: string; summary: TakeSummary; verdict: LevelVerdict } | null>(null);
	lastTake = $state<{ summary: TakeSummary; captureId: number | null; positionLabel: string; filename: string } | null>(null);
	/** How long the last take's steps took, ms (recording, alignment, upload). */
	timings = $state<{ recordMs: number; alignMs: number; uploadMs: number } | null>(null);

	get busy(): boolean {
		return this.phase === 'checking' || this.phase === 'recording' || this.phase === 'aligning' || this.phase === 'uploading';
	}

	/** Fetch the stored test signal the server deconvolves with, so exactly those samples are played. */
	async loadSignal(definition: SignalDefinition): Promise<void> {
		if (this.signal?.definition.id === definition.id) return;
		this.loadingSignal = true;
		try {
			const res = await fetch(`/api/sweeps/${definition.id}/download`);
			if (!res.ok) throw new Error(`The test signal could not be loaded (${res.status}).`);
			const wav = decodeWav(new Uint8Array(await res.arrayBuffer()));
			if (wav.sampleRate !== definition.sampleRate) throw new Error('The stored test signal does not match its definition: make it again on the test signal page.');
			this.signal = { definition, samples: wav.samples, sweepSamples: Math.round(definition.durationS * definition.sampleRate), };
			if (this.rig.ready) await this.rig.useRate(definition.sampleRate);
		} finally {
			this.loadingSignal = false;
		}
	}

	private plan(repetitions: number, firstStart: number): TakePlan {
		const s = this.requireSignal();
		const { f1Hz, f2Hz, durationS, sampleRate } = s.definition;
		return { sampleRate, signal: s.samples, sweepSamples: s.sweepSamples, sweep: { f1Hz, f2Hz, durationS }, repetitions, firstStart };
	}

	private requireSignal(): LoadedSignal {
		if (!this.signal) throw new Error('Choose a test signal first.');
		return this.signal;
	}

	/** Play and record one take and align it; null (with the phase and message set) when it failed. */
	private async record(settings: TakeSettings): Promise<{ result: TakeResult; recordMs: number; alignMs: number } | null> {
		const signal = this.requireSignal();
		const t0 = performance.now();
		this.progress = 0;
		try {
			const { recording, firstStart } = await this.rig.playAndRecord(
				signal.samples,
				settings.repetitions,
				settings.playOn,
				(first) => requiredLength(this.plan(settings.repetitions, first)),
				(f) => (this.progress = f)
			);
			const recordMs = performance.now() - t0;
			if (recording.missingFrames > 0) {
				throw new Error(`The browser missed ${Math.round((recording.missingFrames / signal.definition.sampleRate) * 1000)} ms of the input (the page was too busy): measure again.`);
			}
			if (settings.channel >= recording.channelCount || (settings.loopback !== null && settings.loopback >= recording.channelCount)) {
				throw new Error(`The input has ${recording.channelCount} channel(s): choose the measurement and loopback channels again.`);
			}
			this.phase = this.phase === 'checking' ? 'checking' : 'aligning';
			await nextPaint();
			const t1 = performance.now();
			const result = analyseTake(this.plan(settings.repetitions, firstStart), {
				measured: recording.channel(settings.channel),
				loopback: settings.loopback === null ? undefined : recording.channel(settings.loopback)
			});
			return { result, recordMs, alignMs: performance.now() - t1 };
		} catch (e) {
			this.phase = 'failed';
			this.message = e instanceof TakeError || e instanceof Error ? e.message : String(e);
			return null;
		}
	}

	/** Play the test signal once and judge the input's level; the measurement needs a check without clipping. */
	async checkLevel(settings: TakeSettings, key: string): Promise<void> {
		this.phase = 'checking';
		this.message = null;
		const taken = await this.record({ ...settings, repetitions: 1 });
		if (!taken) {
			this.levelCheck = null;
			return;
		}
		const summary = summarise(taken.result, 1);
		this.levelCheck = { key, summary, verdict: levelVerdict({ peakDbfs: summary.peakDbfs, clipRuns: summary.clipRuns }) };
		this.phase = 'idle';
	}

	/** A take at one position: record, align, average, and upload unless it clipped. */
	async measure(settings: TakeSettings, target: UploadTarget): Promise<void> {
		const signal = this.requireSignal();
		this.phase = 'recording';
		this.message = null;
		this.lastTake = null;
		const taken = await this.record(settings);
		if (!taken) return;
		const summary = summarise(taken.result, settings.repetitions);
		const filename = takeFilename(target.positionLabel, settings.repetitions, new Date());
		const refusal = takeRefusal(taken.result);
		if (refusal) {
			this.phase = 'refused';
			this.message = refusal;
			this.lastTake = { summary, captureId: null, positionLabel: target.positionLabel, filename };
			// A clipped take also spoils the level check it relied on.
			if (this.levelCheck) this.levelCheck = { ...this.levelCheck, verdict: 'clipping' };
			return;
		}
		this.phase = 'uploading';
		const t2 = performance.now();
		const wav = encodeWav(taken.result.average, signal.definition.sampleRate, '32f');
		const file = new File([wav as Uint8Array<ArrayBuffer>], filename, { type: 'audio/wav' });
		const d = signal.definition;
		const queue = new UploadQueue(target.sessionId, () => ({ positions: target.positions, sweeps: [{ id: d.id, name: d.name, durationS: d.durationS }] }));
		queue.add([file]);
		const item = queue.items[queue.items.length - 1];
		item.position = target.position;
		item.kind = 'sweep';
		item.sweep = `id:${d.id}`;
		item.channel = 0;
		await queue.uploadAll(() => {});
		if (item.state !== 'done' || item.captureId === null) {
			this.phase = 'failed';
			this.message = `The recording was made but not uploaded: ${item.message ?? 'unknown reason'}`;
			return;
		}
		this.timings = { recordMs: taken.recordMs, alignMs: taken.alignMs, uploadMs: performance.now() - t2 };
		this.lastTake = { summary, captureId: item.captureId, positionLabel: target.positionLabel, filename };
		this.phase = 'uploaded';
	}
}
