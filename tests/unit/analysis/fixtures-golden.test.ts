// Regression pin: the engine's whole result on every fixture equals the one recorded in
// golden/results.json (written by golden/write.ts from engine 2.0.0 before the speed work of
// issue 13) — each number within 1e-9 relative, every string, key and array length the same.
// The recorded values are the engine's own earlier output, not an outside reference: they keep
// speed changes from changing results; accuracy is checked against sources in the other tests.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { GOLDEN_CASES } from './golden/cases';

const RELATIVE = 1e-9;
const recorded = JSON.parse(readFileSync(fileURLToPath(new URL('./golden/results.json', import.meta.url)), 'utf8')) as Record<string, unknown>;

/** Paths where `actual` differs from `expected`, at most `limit` of them. */
function differences(actual: unknown, expected: unknown, path: string, out: string[], limit = 10): string[] {
	if (out.length >= limit) return out;
	if (typeof expected === 'number' && typeof actual === 'number') {
		const scale = Math.max(Math.abs(expected), Math.abs(actual));
		if (!(actual === expected || Math.abs(actual - expected) <= RELATIVE * scale)) out.push(`${path}: ${actual} ≠ ${expected}`);
		return out;
	}
	if (Array.isArray(expected) || ArrayBuffer.isView(actual)) {
		const list = ArrayBuffer.isView(actual) ? Array.from(actual as unknown as ArrayLike<number>) : actual;
		if (!Array.isArray(list) || !Array.isArray(expected) || list.length !== expected.length) {
			out.push(`${path}: length ${Array.isArray(list) ? list.length : typeof list} ≠ ${Array.isArray(expected) ? expected.length : typeof expected}`);
			return out;
		}
		for (let i = 0; i < expected.length; i++) differences(list[i], expected[i], `${path}[${i}]`, out, limit);
		return out;
	}
	if (expected !== null && typeof expected === 'object') {
		if (actual === null || typeof actual !== 'object') {
			out.push(`${path}: ${JSON.stringify(actual)} is not an object`);
			return out;
		}
		// Keys whose value is undefined are not in JSON.
		const actualKeys = Object.keys(actual).filter((key) => (actual as Record<string, unknown>)[key] !== undefined).sort();
		const expectedKeys = Object.keys(expected).sort();
		if (actualKeys.join() !== expectedKeys.join()) out.push(`${path}: keys ${actualKeys.join()} ≠ ${expectedKeys.join()}`);
		for (const key of expectedKeys) differences((actual as Record<string, unknown>)[key], (expected as Record<string, unknown>)[key], `${path}.${key}`, out, limit);
		return out;
	}
	if (actual !== expected) out.push(`${path}: ${JSON.stringify(actual)} ≠ ${JSON.stringify(expected)}`);
	return out;
}

describe('engine results on the fixtures stay as recorded', () => {
	it('records every case', () => {
		expect(Object.keys(recorded).sort()).toEqual(GOLDEN_CASES.map((golden) => golden.name).sort());
	});

	it('the comparison finds a change of 1e-8 relative in one number', () => {
		const sample = recorded[GOLDEN_CASES[0].name] as { broadband: { t30S: number } };
		const changed = structuredClone(sample);
		changed.broadband.t30S *= 1 + 1e-8;
		expect(differences(changed, sample, '', [])).toHaveLength(1);
		expect(differences(structuredClone(sample), sample, '', [])).toEqual([]);
	});

	for (const golden of GOLDEN_CASES) {
		it(golden.name, () => {
			// Through JSON, as results are stored: typed arrays become arrays, undefined keys vanish.
			const actual = JSON.parse(JSON.stringify(golden.run()));
			expect(differences(actual, recorded[golden.name], '', [])).toEqual([]);
		});
	}
});
