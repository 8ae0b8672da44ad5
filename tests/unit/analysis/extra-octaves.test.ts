import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyseRecording } from '../../../src/lib/analysis/analyse';
import { extraOctaves } from '../../../src/lib/analysis/extra-octaves';

const fixture = (name: string) => new Uint8Array(readFileSync(fileURLToPath(new URL(`../../../fixtures/${name}`, import.meta.url))));
const centres = (bands: { nominalHz?: number; centerHz?: number }[]) => bands.map((b) => b.nominalHz ?? b.centerHz);

describe('extraOctaves: the 31.5 Hz and 16 kHz octaves where the record allows', () => {
	it('needs a sample rate whose half lies above the 16 kHz octave (upper edge 22.4 kHz, IEC 61260-1)', () => {
		expect(centres(extraOctaves(48000, null))).toEqual([31.5, 16000]);
		expect(centres(extraOctaves(44100, null))).toEqual([31.5]);
	});

	it('needs a sweep that covered the band (down to its lower edge, 22.4 Hz; up to 2^¼ above 15.85 kHz, 18.8 kHz)', () => {
		expect(centres(extraOctaves(48000, { f1Hz: 20, f2Hz: 20000 }))).toEqual([31.5, 16000]);
		expect(centres(extraOctaves(48000, { f1Hz: 25, f2Hz: 18000 }))).toEqual([]);
		expect(() => extraOctaves(0, null)).toThrow(RangeError);
	});
});

describe('analyseRecording with extraOctaves', () => {
	// Exponentially decaying white noise, T = 0.6 s, 48 kHz (fixtures/README.md, channel 1).
	const bytes = fixture('stereo-t0.3-t0.6-48k.wav');
	const standard = analyseRecording(bytes, { channel: 1 });
	const extended = analyseRecording(bytes, { channel: 1, extraOctaves: true });

	it('adds 31.5 Hz below and 16 kHz above the standard octaves, leaving those and the broadband values as they were', () => {
		expect(extended.bands.map((b) => b.centerHz)).toEqual([31.5, ...standard.bands.map((b) => b.centerHz), 16000]);
		expect(extended.bands.slice(1, -1)).toEqual(standard.bands);
		expect(extended.broadband).toEqual(standard.broadband);
	});

	it('reads the known T = 0.6 s at 16 kHz within the 5 % JND (ISO 3382-1:2009 Annex A, from memory)', () => {
		const top = extended.bands[extended.bands.length - 1];
		expect(top.centerHz).toBe(16000);
		expect(Math.abs((top.t20S ?? NaN) / 0.6 - 1)).toBeLessThan(0.05);
		expect(Math.abs((top.t30S ?? NaN) / 0.6 - 1)).toBeLessThan(0.05);
	});

	it('leaves them out of a 44.1 kHz recording above, and keeps 31.5 Hz (the real living room, fixtures/README.md)', () => {
		expect(analyseRecording(fixture('living_room_1.wav'), { extraOctaves: true }).bands.map((b) => b.centerHz)).toEqual([31.5, 63, 125, 250, 500, 1000, 2000, 4000, 8000]);
	});
});
