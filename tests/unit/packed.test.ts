// Packed page data (src/lib/packed.ts): a value serialized once arrives in the browser exactly as
// SvelteKit's own serialization would bring it (devalue keeps -0, NaN, undefined, dates and shared
// arrays), and only packed values are sent that way.
import { describe, expect, it } from 'vitest';
import { parse, stringify } from 'devalue';
import { pack, packedTransport } from '../../src/lib/packed';

describe('packed page data', () => {
	it('decodes to what devalue itself round-trips, including values JSON would change', () => {
		const grid = [20, 40, 80];
		const value = { grid, again: grid, minusZero: -0, notANumber: NaN, missing: undefined, when: new Date('2026-12-03T10:00:00Z'), nested: [{ t30S: 0.512345678901234 }] };
		const text = packedTransport.encode(pack(value));
		expect(text).toBe(stringify(value));
		const back = packedTransport.decode(text as string) as typeof value;
		expect(back).toEqual(parse(stringify(value)));
		expect(Object.is(back.minusZero, -0)).toBe(true);
		expect(back.notANumber).toBeNaN();
		expect('missing' in back).toBe(true);
		expect(back.when).toEqual(value.when);
		expect(back.again).toBe(back.grid);
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
