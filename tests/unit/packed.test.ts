// Packed page data (src/lib/packed.ts): a value serialized once arrives in the browser exactly as
// SvelteKit's own serialization would bring it (devalue keeps -0, NaN, undefined, dates and shared
// arrays), curves written compactly come back bit for bit, and only packed values are sent that way.
import { describe, expect, it } from 'vitest';
import { parse, stringify } from 'devalue';
import { pack, packedTransport } from '../../src/lib/packed';

const roundTrip = <T>(value: T): T => packedTransport.decode(packedTransport.encode(pack(value as object)) as string) as T;

describe('packed page data', () => {
	it('decodes to what devalue itself round-trips, including values JSON would change', () => {
		const grid = [20, 40, 80];
		const value = { grid, again: grid, minusZero: -0, notANumber: NaN, missing: undefined, when: new Date('2026-12-03T10:00:00Z'), nested: [{ t30S: 0.512345678901234 }] };
		const back = roundTrip(value);
		expect(back).toEqual(parse(stringify(value)));
		expect(Object.is(back.minusZero, -0)).toBe(true);
		expect(back.notANumber).toBeNaN();
		expect('missing' in back).toBe(true);
		expect(back.when).toEqual(value.when);
		expect(back.again).toBe(back.grid);
	});

	it('brings curves back bit for bit, a shared grid still shared, and runs JSON cannot hold as devalue writes them', () => {
		const freqHz = Array.from({ length: 479 }, (_, i) => 20 * 2 ** (i / 48));
		const db = freqHz.map((f) => 10 * Math.log10(1 + f / 1000) - 0.1 * Math.sin(f));
		const withMinusZero = [...db.slice(0, 10), -0];
		const withNaN = [...db.slice(0, 10), NaN];
		const value = { curves: [{ freqHz, db }, { freqHz, db: db.map((x) => x / 3) }], withMinusZero, withNaN };
		const text = packedTransport.encode(pack(value)) as string;
		expect(text.length).toBeLessThan(stringify(value).length);
		const back = packedTransport.decode(text) as typeof value;
		back.curves.forEach((c, i) => {
			c.db.forEach((x, j) => expect(Object.is(x, value.curves[i].db[j])).toBe(true));
			expect(c.freqHz).toEqual(freqHz);
		});
		expect(back.curves[1].freqHz).toBe(back.curves[0].freqHz);
		expect(Object.is(back.withMinusZero.at(-1), -0)).toBe(true);
		expect(back.withNaN.at(-1)).toBeNaN();
		expect(Array.isArray(back.curves[0].db)).toBe(true);
	});

	it('is serialized when packed, not when sent: a later change would not be sent (so packed values are frozen first)', () => {
		const value = { n: 1 };
		pack(value);
		value.n = 2;
		expect((packedTransport.decode(packedTransport.encode(value) as string) as { n: number }).n).toBe(1);
	});

	it('leaves every value that was not packed to SvelteKit', () => {
		for (const v of [{ n: 1 }, [1, 2], 'text', 3, null, undefined]) expect(packedTransport.encode(v)).toBe(false);
	});
});
