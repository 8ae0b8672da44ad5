// What every chart of a room shows besides the measurement: its modes below the Schroeder
// frequency, its problem bands, and its target.
import { roomModes, schroederFrequency } from '../analysis/room';
import { formatHz } from '../format';
import type { TargetBand } from '../analysis/targets';
import { defaultTarget } from '../results/comparison';
import type { ModeMarker } from '../charts/response-data';
import type { ProblemBandView } from '../results/types';
import type { FrequencyProblemBand } from '../components/charts/ResponseChart.svelte';

export interface RoomDims {
	lengthM: number;
	widthM: number;
	heightM: number;
	volumeM3: number;
	roomUse: string;
}

/** Modes up to the Schroeder frequency for the room's measured mid-band T (at most 120 marks). */
export function modeMarks(room: RoomDims, t60S: number | null): { modes: ModeMarker[]; schroederHz: number | null } {
	if (!t60S || !(t60S > 0)) return { modes: [], schroederHz: null };
	const fs = schroederFrequency(t60S, room.volumeM3);
	const modes = roomModes(room, fs)
		.slice(0, 120)
		.map((m) => ({ freqHz: m.freqHz, kind: m.kind, label: `(${m.n.join(',')}) ${formatHz(m.freqHz)} ${m.kind}` }));
	return { modes, schroederHz: fs };
}

export function problemBandMarks(bands: ProblemBandView[]): FrequencyProblemBand[] {
	return bands.map((b) => ({ id: b.id, fLoHz: b.fLoHz, fHiHz: b.fHiHz, severity: b.severity, label: `${b.note}${b.status === 'addressed' ? ' (addressed)' : ''}` }));
}

/** The target shown for a room: the comparison's default (ITU-R BS.1116-3 for rooms used for critical listening, 63 Hz – 8 kHz). */
export function roomTarget(room: RoomDims, centersHz: number[]): TargetBand[] {
	return defaultTarget(room, centersHz);
}
