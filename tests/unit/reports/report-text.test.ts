import { describe, expect, it } from 'vitest';
import { reportBandRows } from '../../../src/lib/server/reports/report-data';
import { DEFAULT_TARGET_BASIS, methodParagraphs } from '../../../src/lib/server/reports/report-text';
import { sparseComparison, typicalComparison } from './helpers/comparison-factory';

describe('methodParagraphs', () => {
	it('names the standards, the band span, the matched positions and the target basis', () => {
		const comparison = typicalComparison();
		const text = methodParagraphs(comparison, reportBandRows(comparison), DEFAULT_TARGET_BASIS).join(' ');
		expect(text).toContain('ISO 3382-2');
		expect(text).toContain('IEC 61260-1');
		expect(text).toContain('octave bands from 63 Hz to 8 kHz');
		expect(text).toContain('over the 3 positions measured in both visits: Mix seat, Sofa left and Sofa right.');
		expect(text).toContain('Door (before only)');
		expect(text).toContain('follow ITU-R BS.1116-3.');
	});

	it('says so when there is no target, one position, or none in common', () => {
		const sparse = sparseComparison();
		const text = methodParagraphs(sparse, reportBandRows(sparse), DEFAULT_TARGET_BASIS).join(' ');
		expect(text).toContain('over the 1 position measured in both visits: A.');
		expect(text).toContain('No target reverberation time was set for this room.');
		expect(text).not.toContain('BS.1116');
		const none = methodParagraphs({ ...sparse, matchedPositions: [] }, [], 'DIN 18041').join(' ');
		expect(none).toContain('No measurement position was measured in both visits');
		expect(none).toContain('octave bands from 63 Hz to 8 kHz');
	});

	it('names another target basis when given', () => {
		const comparison = typicalComparison();
		expect(methodParagraphs(comparison, [], 'DIN 18041 (group A1)').join(' ')).toContain('follow DIN 18041 (group A1).');
	});
});
