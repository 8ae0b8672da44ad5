import { describe, expect, it } from 'vitest';
import {
	captureBandsCsv,
	captureBandsJson,
	comparisonCsv,
	comparisonJson,
	sessionAverageCsv,
	sessionAverageJson,
	sessionPositionsCsv
} from '../../../src/lib/results/exports';
import { compareSessions } from '../../../src/lib/results/comparison';
import { makeBand, makeRoom, makeSession } from './factories';
import { csvTable as table, parseCsv } from '../../helpers/rfc4180';


const num = (field: string) => (field === '' ? null : Number(field));

describe('the test’s RFC 4180 reader itself', () => {
	it.each([
		{ text: 'a,b\r\n1,2\r\n', records: [['a', 'b'], ['1', '2']] },
		{ text: '"x, y","say ""hi""","two\r\nlines"\r\n', records: [['x, y', 'say "hi"', 'two\r\nlines']] },
		{ text: 'a,,c\r\n', records: [['a', '', 'c']] },
		{ text: 'a,b', records: [['a', 'b']] } // no line break after the last record (§2 rule 2)
	])('reads $text', ({ text, records }) => {
		expect(parseCsv(text)).toEqual(records);
	});
	it.each(['a\nb\r\n', 'a"b"\r\n', '"a\r\n'])('refuses %j', (text) => {
		expect(() => parseCsv(text)).toThrow();
	});
});

const bands = [
	makeBand({ centerHz: 250, edtS: 0.4321, t20S: 0.41, t30S: 0.4, c50Db: 3.456, c80Db: 7.891, d50: 0.6789, tsMs: 30.26, peakToNoiseDb: 55.55 }),
	makeBand({ centerHz: 125, edtS: 0.9, t20S: 0.85, t30S: null, c50Db: -1.234, c80Db: 1.5, d50: 0.43, tsMs: 80.04, peakToNoiseDb: 41.2, biased: true })
];
const broadband = makeBand({ centerHz: 0, t30S: 0.55, c80Db: 5.5 });

describe('captureBandsCsv', () => {
	const csv = captureBandsCsv({ bands, broadband });

	it('ends every line with CRLF and puts units in the header, no comment line', () => {
		expect(csv.endsWith('\r\n')).toBe(true);
		expect(csv.replaceAll('\r\n', '')).not.toMatch(/[\r\n]/);
		expect(parseCsv(csv)[0]).toEqual(['centre_Hz', 'EDT_s', 'T20_s', 'T30_s', 'C50_dB', 'C80_dB', 'D50', 'Ts_ms', 'peak_to_noise_dB', 'biased']);
		expect(csv.startsWith('#')).toBe(false);
	});

	it('has one row per band from low to high, then broadband', () => {
		expect(table(csv).map((row) => row.centre_Hz)).toEqual(['125', '250', 'broadband']);
	});

	it('writes a null as an empty field (RFC 4180 allows empty fields; null = not measurable)', () => {
		const [low] = table(csv);
		expect(low.T30_s).toBe('');
		expect(low.biased).toBe('true');
	});

	// Read back, each number is within half a unit of its last written decimal: 0.5 ms for s, 0.005 dB, 0.0005 for D50, 0.05 ms for Ts.
	it.each([
		{ column: 'EDT_s', key: 'edtS', tolerance: 0.0005 },
		{ column: 'T20_s', key: 't20S', tolerance: 0.0005 },
		{ column: 'C50_dB', key: 'c50Db', tolerance: 0.005 },
		{ column: 'C80_dB', key: 'c80Db', tolerance: 0.005 },
		{ column: 'D50', key: 'd50', tolerance: 0.0005 },
		{ column: 'Ts_ms', key: 'tsMs', tolerance: 0.05 },
		{ column: 'peak_to_noise_dB', key: 'peakToNoiseDb', tolerance: 0.05 }
	] as const)('$column reads back within $tolerance', ({ column, key, tolerance }) => {
		const rows = table(csv);
		for (const source of bands) {
			const row = rows.find((r) => Number(r.centre_Hz) === source.centerHz);
			expect(Math.abs((num(row?.[column] ?? '') ?? NaN) - (source[key] as number))).toBeLessThanOrEqual(tolerance + 1e-12);
		}
	});
});

describe('sessionPositionsCsv: labels people typed are quoted as RFC 4180 §2 rules 6–7 ask', () => {
	const labels = ['P1, sofa', 'Mic "A"', 'desk\r\nleft', 'plain'];
	const summary = makeSession(labels.map((label, i) => ({ label, captureId: 10 + i, bands: [{ centerHz: 500, t30S: 0.5 + i / 10 }] })));
	const csv = sessionPositionsCsv(summary);

	it.each([
		['a comma', '"P1, sofa"'],
		['a quote, doubled', '"Mic ""A"""'],
		['a line break', '"desk\r\nleft"'],
		['nothing special, unquoted', '\r\nplain,13,']
	])('a label with %s is written %j', (_, written) => {
		expect(csv).toContain(written);
	});

	it('reads back to the same labels, capture ids and values', () => {
		const rows = table(csv);
		expect(rows).toHaveLength(8); // one band and broadband per position
		const bandRows = rows.filter((r) => r.centre_Hz === '500');
		expect(bandRows.map((r) => r.position)).toEqual(labels);
		expect(bandRows.map((r) => Number(r.capture_id))).toEqual([10, 11, 12, 13]);
		bandRows.forEach((r, i) => expect(Number(r.T30_s)).toBeCloseTo(0.5 + i / 10, 12));
	});
});

describe('sessionAverageCsv', () => {
	const summary = makeSession([
		{ label: 'P1', bands: [{ centerHz: 125, t30S: 0.5, c80Db: 1 }], broadband: { t30S: 0.5 } },
		{ label: 'P2', bands: [{ centerHz: 125, t30S: 0.55, c80Db: null }], broadband: { t30S: 0.6 } },
		{ label: 'P3', bands: [{ centerHz: 125, t30S: 0.6, c80Db: 3 }], broadband: { t30S: null } }
	]);
	const rows = table(sessionAverageCsv(summary));

	it('has mean, std and count columns for each metric', () => {
		const header = parseCsv(sessionAverageCsv(summary))[0];
		for (const name of ['EDT', 'T20', 'T30']) expect(header).toEqual(expect.arrayContaining([`${name}_mean_s`, `${name}_std_s`, `${name}_count`]));
		expect(header).toEqual(expect.arrayContaining(['C80_mean_dB', 'C80_count', 'D50_mean', 'Ts_mean_ms']));
	});

	// Arithmetic means worked by hand (ISO 3382-2 averaging, as in session.test.ts); 0.0005 s = half the last decimal written.
	it.each([
		{ centre: '125', column: 'T30_mean_s', value: 0.55, count: 3, countColumn: 'T30_count' },
		{ centre: '125', column: 'C80_mean_dB', value: 2, count: 2, countColumn: 'C80_count' },
		{ centre: 'broadband', column: 'T30_mean_s', value: 0.55, count: 2, countColumn: 'T30_count' },
		{ centre: '125', column: 'EDT_mean_s', value: null, count: 0, countColumn: 'EDT_count' }
	])('$centre $column = $value over $count', ({ centre, column, value, count, countColumn }) => {
		const row = rows.find((r) => r.centre_Hz === centre);
		if (value === null) expect(row?.[column]).toBe('');
		else expect(Math.abs((num(row?.[column] ?? '') ?? NaN) - value)).toBeLessThanOrEqual(0.0005);
		expect(Number(row?.[countColumn])).toBe(count);
	});
});

describe('comparisonCsv and comparisonJson', () => {
	// V = 72.8 m³ listening room → BS.1116-3 target Tm = 0.25·(V/100)^(1/3) s ± 0.05 s at 500 Hz (ITU-R BS.1116-3; formula and tolerance from memory).
	const tm = 0.25 * Math.cbrt(0.728);
	const baseline = makeSession([{ label: 'P1', bands: [{ centerHz: 500, t30S: 0.6, edtS: 0.5, c50Db: 0, c80Db: 2 }, { centerHz: 1000, t30S: null, t20S: 0.4 }] }], { conditionLabel: 'untreated, "as found"' });
	const treated = makeSession([{ label: 'P1', bands: [{ centerHz: 500, t30S: 0.24, edtS: 0.25, c50Db: 4, c80Db: 7 }, { centerHz: 1000, t30S: 0.2, t20S: 0.21 }] }], { sessionId: 2, conditionLabel: 'panels' });
	const model = compareSessions(makeRoom(), baseline, treated);
	const rows = table(comparisonCsv(model));

	it('has one row per band with the difference after − before and the relative change in %', () => {
		expect(rows.map((r) => r.centre_Hz)).toEqual(['500', '1000']);
		const [r500] = rows;
		expect(num(r500.T30_before_s)).toBeCloseTo(0.6, 12);
		expect(num(r500.T30_after_s)).toBeCloseTo(0.24, 12);
		expect(num(r500.T30_difference_s)).toBeCloseTo(0.24 - 0.6, 12);
		expect(num(r500.T30_change_pct)).toBeCloseTo((100 * (0.24 - 0.6)) / 0.6, 12); // −60 %
		expect(num(r500.EDT_change_pct)).toBeCloseTo(-50, 12);
		expect(num(r500.C80_difference_dB)).toBeCloseTo(5, 12);
		expect(r500.C50_change_pct).toBeUndefined(); // no relative change for levels in dB
	});

	it('writes the target range and both verdicts with the metric behind them', () => {
		const [r500, r1000] = rows;
		// 0.0005 s: the target is written to 3 decimals.
		expect(Math.abs((num(r500.target_s) ?? NaN) - tm)).toBeLessThanOrEqual(0.0005);
		expect(Math.abs((num(r500.target_lower_s) ?? NaN) - (tm - 0.05))).toBeLessThanOrEqual(0.0005);
		expect(Math.abs((num(r500.target_upper_s) ?? NaN) - (tm + 0.05))).toBeLessThanOrEqual(0.0005);
		expect([r500.verdict_before, r500.verdict_before_metric, r500.verdict_after, r500.verdict_after_metric]).toEqual(['above', 'T30', 'inside', 'T30']);
		expect([r1000.verdict_before, r1000.verdict_before_metric, r1000.T30_before_s]).toEqual(['above', 'T20', '']);
	});

	it('leaves target and verdict fields empty where there is no target', () => {
		const none = table(comparisonCsv(compareSessions(makeRoom({ roomUse: 'speech' }), baseline, treated)));
		expect([none[0].target_s, none[0].verdict_before, none[0].verdict_after_metric]).toEqual(['', '', '']);
	});

	it('JSON carries its schema, the visits, bands with targets and verdicts, and round-trips', () => {
		const json = comparisonJson(model);
		expect(json.schema).toBe('ringdown.comparison/1');
		expect(json.baseline).toEqual({ sessionId: 1, conditionLabel: 'untreated, "as found"', measuredOn: '2026-03-01' });
		expect(json.matchedPositions).toEqual(['P1']);
		expect(json.bands[0].metrics.t30S.difference).toBeCloseTo(-0.36, 12);
		expect(json.bands[0].target?.targetS).toBeCloseTo(tm, 12);
		expect(json.bands[1].verdictBefore).toEqual({ verdict: 'above', measuredS: 0.4, metric: 'T20' });
		expect(json.summary).toEqual(model.summary);
		expect(JSON.parse(JSON.stringify(json))).toEqual(json);
	});
});

describe('JSON documents of a capture and a visit', () => {
	it('captureBandsJson: schema, bands low to high, units in the field names, round-trips', () => {
		const json = captureBandsJson({ bands, broadband });
		expect(json.schema).toBe('ringdown.capture-bands/1');
		expect(json.bands.map((b) => b.centerHz)).toEqual([125, 250]);
		expect(Object.keys(json.bands[0]).sort()).toEqual(['biased', 'c50Db', 'c80Db', 'centerHz', 'curvaturePct', 'd50', 'edtS', 'exactHz', 'peakToNoiseDb', 't20S', 't30S', 'tsMs']);
		expect(json.bands[1].c50Db).toBe(3.456); // JSON keeps full precision
		expect(json.broadband.t30S).toBe(0.55);
		expect(JSON.parse(JSON.stringify(json))).toEqual(json);
	});

	it('sessionAverageJson: schema, means with counts, outliers, round-trips', () => {
		const summary = makeSession([
			{ label: 'P1', bands: [{ centerHz: 500, t30S: 0.5 }] },
			{ label: 'P2', bands: [{ centerHz: 500, t30S: 0.5 }] },
			{ label: 'P3', bands: [{ centerHz: 500, t30S: 0.7 }] } // +40 %: an outlier (20 % rule, common practice, no source)
		]);
		const json = sessionAverageJson(summary);
		expect(json.schema).toBe('ringdown.session-average/1');
		expect(json.positions.map((p) => p.positionLabel)).toEqual(['P1', 'P2', 'P3']);
		expect(json.bands[0].metrics.t30S.mean).toBeCloseTo(1.7 / 3, 12);
		expect(json.bands[0].metrics.t30S.count).toBe(3);
		expect(json.outliers.map((o) => o.positionLabel)).toEqual(['P3']);
		expect(json.averageResponse?.db).toHaveLength(4);
		expect(JSON.parse(JSON.stringify(json))).toEqual(json);
	});
});
