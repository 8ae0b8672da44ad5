/** A stored test signal as the measurement page needs it: the browser plays its WAV and needs its sweep law. */
export interface MeasureSignal {
	id: number;
	name: string;
	f1Hz: number;
	f2Hz: number;
	durationS: number;
	silenceS: number;
	sampleRate: number;
	levelDbfs: number;
}
