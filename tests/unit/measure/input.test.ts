import { describe, expect, it } from 'vitest';
import { inputConstraints, inputWarnings, processingLines } from '../../../src/lib/measure/input-settings';
import { firstFreeLabel, nextPositionLabel, takeFilename } from '../../../src/lib/measure/positions';
import { TakeRecording } from '../../../src/lib/measure/recording';

describe('what the input is asked for and what is said about it', () => {
	it('asks for the device exactly, with the three kinds of voice processing off', () => {
		expect(inputConstraints('abc')).toEqual({ deviceId: { exact: 'abc' }, echoCancellation: false, noiseSuppression: false, autoGainControl: false, channelCount: { ideal: 2 } });
		expect(inputConstraints(null)).not.toHaveProperty('deviceId');
	});

	it('warns for each processing the browser kept on or does not report, and for a resampled input', () => {
		expect(inputWarnings({ echoCancellation: false, noiseSuppression: false, autoGainControl: false, sampleRate: 48_000 }, 48_000)).toEqual([]);
		const kept = inputWarnings({ echoCancellation: true, noiseSuppression: false, autoGainControl: true, sampleRate: 48_000 }, 48_000);
		expect(kept).toHaveLength(2);
		expect(kept[0]).toMatch(/^Echo cancellation stays on/);
		expect(kept[1]).toMatch(/^Automatic gain control stays on/);
		expect(inputWarnings({ echoCancellation: false, autoGainControl: false }, null)).toEqual([expect.stringMatching(/does not say whether noise suppression is off/)]);
		expect(inputWarnings({ echoCancellation: false, noiseSuppression: false, autoGainControl: false, sampleRate: 44_100 }, 48_000)).toEqual([expect.stringMatching(/44\.1 kHz.*48 kHz/)]);
	});

	it('reads an echo cancellation mode string as on, and "none" as off', () => {
		expect(processingLines({ echoCancellation: 'remote-only' })[0].state).toBe('on');
		expect(processingLines({ echoCancellation: 'none' })[0].state).toBe('off');
	});
});

describe('positions and file names', () => {
	it.each([
		['P1', 'P2'],
		['P9', 'P10'],
		['Seat 12', 'Seat 13'],
		['Sofa', 'Sofa 2'],
		['', 'P 2']
	])('after %s comes %s', (current, next) => expect(nextPositionLabel(current)).toBe(next));

	it('finds the first free P-number', () => {
		expect(firstFreeLabel([])).toBe('P1');
		expect(firstFreeLabel(['P1', 'P2', 'P4'])).toBe('P3');
	});

	it('names a take by its position, repetitions and time, as a WAV file the upload accepts', () => {
		const name = takeFilename('Listening seat / left', 3, new Date(2026, 11, 3, 9, 5, 7));
		expect(name).toBe('Listening-seat-left-measured-3x-20261203-090507.wav');
		expect(takeFilename('///', 1, new Date(2026, 0, 1))).toMatch(/^position-measured-1x-/);
	});
});

describe('the take recording, assembled from posted blocks', () => {
	const block = (frame: number, values: number[], channels = 1) => ({ frame, channels: Array.from({ length: channels }, (_, c) => Float32Array.from(values.map((v) => v + c * 100))) });

	it('places blocks by their frame, grows past its first size and keeps every channel', () => {
		const r = new TakeRecording(4);
		r.push(block(1000, [1, 2, 3], 2));
		r.push(block(1003, [4, 5, 6, 7, 8], 2));
		expect(r.startFrame).toBe(1000);
		expect(r.length).toBe(8);
		expect(Array.from(r.channel(0))).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
		expect(Array.from(r.channel(1))).toEqual([101, 102, 103, 104, 105, 106, 107, 108]);
		expect(r.indexOf(1005)).toBe(5);
		expect(r.missingFrames).toBe(0);
	});

	it('leaves zeros for frames that never came and counts them; ignores a block already written', () => {
		const r = new TakeRecording(4);
		r.push(block(0, [1, 1]));
		r.push(block(5, [2, 2]));
		r.push(block(0, [9, 9]));
		r.push(block(6, [3, 3])); // overlaps the last frame written
		expect(Array.from(r.channel(0))).toEqual([1, 1, 0, 0, 0, 2, 2, 3]);
		expect(r.missingFrames).toBe(3);
	});

	it('refuses a channel the input does not have', () => {
		const r = new TakeRecording();
		r.push(block(0, [1]));
		expect(() => r.channel(1)).toThrow(/channel 1 does not exist/);
	});
});
