// The measurement page's audio: the input and output devices, one audio context at the test
// signal's sample rate, the capture worklet that hands the input to the page block by block
// (for the meter, and for a take while one runs), and playback scheduled on the same context's
// clock, so a take knows the recording index at which each repetition was sent.
import { inputConstraints, type InputSettings } from '$lib/measure/input-settings';
import { MeterState } from '$lib/measure/levels';
import { TakeRecording, type CapturedBlock } from '$lib/measure/recording';

/** Served from static/: the page's CSP allows scripts from the app only. */
export const WORKLET_URL = '/measure/capture-worklet.js';
/** Input recorded before the first repetition is sent: the background, and room for an early arrival. */
export const PREROLL_S = 0.5;
/** Playback is scheduled at least this far ahead of the context's clock. */
const SCHEDULE_AHEAD_S = 0.2;
/** No input for this long during a take means the input stopped. */
const STALL_S = 2;

export interface DeviceChoice {
	id: string;
	label: string;
}

export interface ChannelLevel {
	peakDbfs: number;
	rmsDbfs: number;
	heldPeakDbfs: number;
	clipping: boolean;
}

export type PlayOn = 'both' | 'left' | 'right';

export interface TakeRecordingDone {
	recording: TakeRecording;
	/** Recording index at which the first repetition was sent. */
	firstStart: number;
}

type ContextWithSink = AudioContext & { setSinkId?: (id: string) => Promise<void> };

export class AudioRig {
	inputs = $state<DeviceChoice[]>([]);
	outputs = $state<DeviceChoice[]>([]);
	inputId = $state<string | null>(null);
	outputId = $state<string>('');
	settings = $state<InputSettings | null>(null);
	levels = $state<ChannelLevel[]>([]);
	sampleRate = $state<number | null>(null);
	ready = $state(false);
	/** The output can be chosen (AudioContext.setSinkId); otherwise the system's default plays. */
	canChooseOutput = $state(false);

	private context: ContextWithSink | null = null;
	private stream: MediaStream | null = null;
	private source: MediaStreamAudioSourceNode | null = null;
	private node: AudioWorkletNode | null = null;
	private meters: MeterState[] = [];
	private take: TakeRecording | null = null;
	private lastBlockAt = 0;

	/** Open the input (asking for permission), list the devices, and start the context at this rate. */
	async start(sampleRate: number): Promise<void> {
		await this.useRate(sampleRate);
		await this.openInput();
		await this.listDevices();
		navigator.mediaDevices.addEventListener('devicechange', this.onDeviceChange);
		this.ready = true;
	}

	private onDeviceChange = () => void this.listDevices();

	async listDevices(): Promise<void> {
		const all = await navigator.mediaDevices.enumerateDevices();
		const named = (d: MediaDeviceInfo, i: number, kind: string) => ({ id: d.deviceId, label: d.label || `${kind} ${i + 1}` });
		this.inputs = all.filter((d) => d.kind === 'audioinput').map((d, i) => named(d, i, 'Input'));
		this.outputs = all.filter((d) => d.kind === 'audiooutput').map((d, i) => named(d, i, 'Output'));
	}

	/** A context at the test signal's sample rate (a new one when the rate changes). */
	async useRate(sampleRate: number): Promise<void> {
		if (this.context && this.context.sampleRate === sampleRate) return;
		const reopen = Boolean(this.stream);
		await this.closeContext();
		const context: ContextWithSink = new AudioContext({ sampleRate, latencyHint: 'interactive' });
		if (context.sampleRate !== sampleRate) {
			await context.close();
			throw new Error(`This browser cannot run audio at ${sampleRate} Hz; choose a test signal at another rate.`);
		}
		await context.audioWorklet.addModule(WORKLET_URL);
		this.context = context;
		this.canChooseOutput = typeof context.setSinkId === 'function';
		if (this.outputId && context.setSinkId) await context.setSinkId(this.outputId);
		this.sampleRate = sampleRate;
		if (reopen) await this.openInput();
	}

	/** (Re)open the chosen input: a fresh stream, so each take starts from the device's own start. */
	async openInput(inputId: string | null = this.inputId): Promise<void> {
		const context = this.requireContext();
		this.stopInput();
		const stream = await navigator.mediaDevices.getUserMedia({ audio: inputConstraints(inputId) });
		const track = stream.getAudioTracks()[0];
		const settings = track.getSettings() as MediaTrackSettings & InputSettings;
		this.stream = stream;
		this.settings = {
			echoCancellation: settings.echoCancellation,
			noiseSuppression: settings.noiseSuppression,
			autoGainControl: settings.autoGainControl,
			sampleRate: settings.sampleRate,
			channelCount: settings.channelCount
		};
		this.inputId = settings.deviceId ?? inputId;
		this.source = context.createMediaStreamSource(stream);
		const channels = Math.max(1, settings.channelCount ?? 1);
		this.node = new AudioWorkletNode(context, 'ringdown-capture', { numberOfInputs: 1, numberOfOutputs: 0, channelCount: channels, channelCountMode: 'explicit', channelInterpretation: 'discrete' });
		this.node.port.onmessage = (e: MessageEvent<CapturedBlock>) => this.onBlock(e.data);
		this.source.connect(this.node);
		this.meters = [];
		this.levels = [];
		if (context.state !== 'running') await context.resume();
	}

	async chooseOutput(id: string): Promise<void> {
		this.outputId = id;
		if (this.context?.setSinkId) await this.context.setSinkId(id);
	}

	private onBlock(block: CapturedBlock): void {
		this.lastBlockAt = performance.now();
		const rate = this.sampleRate ?? 48_000;
		while (this.meters.length < block.channels.length) this.meters.push(new MeterState(rate));
		this.levels = block.channels.map((samples, c) => {
			const m = this.meters[c];
			m.push(samples);
			return { peakDbfs: m.peakDbfs, rmsDbfs: m.rmsDbfs, heldPeakDbfs: m.heldPeakDbfs, clipping: m.clipping };
		});
		this.take?.push(block);
	}

	/** The input's channels as the worklet delivers them (after the first block). */
	get channelCount(): number {
		return this.levels.length;
	}

	/**
	 * Play `signal` `repetitions` times back to back and record the input from a fresh stream until
	 * `needed(firstStart)` samples are in; `onProgress` hears the fraction done.
	 */
	async playAndRecord(signal: Float64Array, repetitions: number, playOn: PlayOn, needed: (firstStart: number) => number, onProgress: (fraction: number) => void): Promise<TakeRecordingDone> {
		await this.openInput();
		const context = this.requireContext();
		const recording = new TakeRecording(1 << 18);
		this.take = recording;
		try {
			const startFrame = await this.firstFrame(recording);
			const rate = context.sampleRate;
			const sendAt = Math.max(startFrame + Math.round(PREROLL_S * rate), Math.ceil((context.currentTime + SCHEDULE_AHEAD_S) * rate));
			const firstStart = sendAt - startFrame;
			const total = needed(firstStart);

			// One buffer holding every repetition: the periods are exact to the sample.
			const buffer = context.createBuffer(1, signal.length * repetitions, rate);
			const one = Float32Array.from(signal);
			const data = buffer.getChannelData(0);
			for (let k = 0; k < repetitions; k++) data.set(one, k * signal.length);
			const player = context.createBufferSource();
			player.buffer = buffer;
			if (playOn === 'both') player.connect(context.destination);
			else {
				const merger = context.createChannelMerger(2);
				player.connect(merger, 0, playOn === 'left' ? 0 : 1);
				merger.connect(context.destination);
			}
			player.start(sendAt / rate);

			await new Promise<void>((resolve, reject) => {
				const timer = setInterval(() => {
					onProgress(Math.min(1, recording.length / total));
					if (recording.length >= total) {
						clearInterval(timer);
						resolve();
					} else if (performance.now() - this.lastBlockAt > STALL_S * 1000) {
						clearInterval(timer);
						player.stop();
						reject(new Error('The input stopped delivering sound during the measurement: check the device and measure again.'));
					}
				}, 100);
			});
			return { recording, firstStart };
		} finally {
			this.take = null;
		}
	}

	private firstFrame(recording: TakeRecording): Promise<number> {
		const since = performance.now();
		return new Promise((resolve, reject) => {
			const timer = setInterval(() => {
				if (recording.startFrame !== null) {
					clearInterval(timer);
					resolve(recording.startFrame);
				} else if (performance.now() - since > STALL_S * 1000) {
					clearInterval(timer);
					reject(new Error('The input delivers no sound: check that the device is connected and allowed.'));
				}
			}, 20);
		});
	}

	private requireContext(): ContextWithSink {
		if (!this.context) throw new Error('The audio is not started yet.');
		return this.context;
	}

	private stopInput(): void {
		this.source?.disconnect();
		this.node?.disconnect();
		if (this.node) this.node.port.onmessage = null;
		for (const t of this.stream?.getTracks() ?? []) t.stop();
		this.stream = this.source = this.node = null;
	}

	private async closeContext(): Promise<void> {
		this.stopInput();
		if (this.context) await this.context.close().catch(() => {});
		this.context = null;
	}

	async close(): Promise<void> {
		if (typeof navigator !== 'undefined') navigator.mediaDevices?.removeEventListener('devicechange', this.onDeviceChange);
		await this.closeContext();
		this.ready = false;
	}
}
