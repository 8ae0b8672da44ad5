// What the measurement asks of the browser's input, and what to say when the browser does not
// give it. Voice processing (echo cancellation, noise suppression, automatic gain) reshapes the
// room's decay — it is made to remove reverberation and level changes — so a measurement needs
// all three off; and the input should run at the test signal's rate, or the browser resamples it.
import { formatSampleRate } from '../format';

export const VOICE_PROCESSING = ['echoCancellation', 'noiseSuppression', 'autoGainControl'] as const;
export type VoiceProcessing = (typeof VOICE_PROCESSING)[number];

const NAMES: Record<VoiceProcessing, string> = {
	echoCancellation: 'Echo cancellation',
	noiseSuppression: 'Noise suppression',
	autoGainControl: 'Automatic gain control'
};

/** The constraints of getUserMedia's audio for one input device. */
export function inputConstraints(deviceId: string | null, channelCount = 2): MediaTrackConstraints {
	return {
		...(deviceId ? { deviceId: { exact: deviceId } } : {}),
		echoCancellation: false,
		noiseSuppression: false,
		autoGainControl: false,
		channelCount: { ideal: channelCount }
	};
}

/** The subset of MediaTrackSettings read back. */
export interface InputSettings {
	echoCancellation?: boolean | string;
	noiseSuppression?: boolean;
	autoGainControl?: boolean;
	sampleRate?: number;
	channelCount?: number;
}

export interface SettingLine {
	label: string;
	/** Off as asked, on against the request, or not reported by this browser. */
	state: 'off' | 'on' | 'unknown';
}

/** The three voice-processing settings as the browser reports them. */
export function processingLines(settings: InputSettings): SettingLine[] {
	return VOICE_PROCESSING.map((key) => {
		const value = settings[key];
		// Some browsers report echo cancellation as a string mode ("remote-only", "all"); anything but false/"none" is on.
		const state = value === undefined ? 'unknown' : value === false || value === 'none' ? 'off' : 'on';
		return { label: NAMES[key], state };
	});
}

/** Warnings for the page: each voice processing the browser kept on, and a resampled input. */
export function inputWarnings(settings: InputSettings, signalRate: number | null): string[] {
	const warnings: string[] = [];
	for (const line of processingLines(settings)) {
		if (line.state === 'on') {
			warnings.push(`${line.label} stays on in this browser although it was asked to turn it off: it reshapes the decay, so the results cannot be trusted. Use another browser, or an audio interface whose driver the browser does not process.`);
		} else if (line.state === 'unknown') {
			warnings.push(`This browser does not say whether ${line.label.toLowerCase()} is off; check the system's sound settings.`);
		}
	}
	if (signalRate !== null && settings.sampleRate !== undefined && settings.sampleRate !== signalRate) {
		warnings.push(
			`The input runs at ${formatSampleRate(settings.sampleRate)} and the test signal at ${formatSampleRate(signalRate)}: the browser resamples the input. Set the interface to ${formatSampleRate(signalRate)} (or use a test signal at its rate) for the cleanest recording.`
		);
	}
	return warnings;
}
