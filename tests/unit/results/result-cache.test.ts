// The bounded cache behind the results pages: least recently used entries go first, values are
// frozen, and the cached value is handed back without working it out again.
import { describe, expect, it } from 'vitest';
import { deepFreeze, Lru } from '../../../src/lib/server/results/cache';

describe('Lru', () => {
	it('keeps at most its capacity, dropping the least recently used', async () => {
		const c = new Lru<number>(2);
		c.set('a', 1);
		c.set('b', 2);
		expect(c.get('a')).toBe(1); // a is now the most recent
		c.set('c', 3);
		expect(c.get('b')).toBeUndefined();
		expect(c.get('a')).toBe(1);
		expect(c.get('c')).toBe(3);
		expect(c.size).toBe(2);
	});

	it('works a value out once per key', async () => {
		const c = new Lru<{ n: number }>(4);
		let calls = 0;
		const make = () => ({ n: ++calls });
		const first = await c.through('k', make);
		const second = await c.through('k', make);
		expect(second).toBe(first);
		expect(calls).toBe(1);
		expect((await c.through('other', make)).n).toBe(2);
	});

	it('refuses a capacity that is not a positive integer', () => {
		expect(() => new Lru(0)).toThrow(RangeError);
		expect(() => new Lru(1.5)).toThrow(RangeError);
	});
});

describe('deepFreeze', () => {
	it('freezes nested objects and arrays so a cached result cannot be changed in place', () => {
		const v = deepFreeze({ positions: [{ response: { db: [1, 2, 3] }, bands: [{ t30S: 0.5 }] }] });
		expect(() => v.positions[0].response.db.push(4)).toThrow(TypeError);
		expect(() => {
			v.positions[0].bands[0].t30S = 1;
		}).toThrow(TypeError);
		expect(v.positions[0].response.db).toEqual([1, 2, 3]);
	});
});
