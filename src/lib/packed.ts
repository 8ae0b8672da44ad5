// Page data that stays the same from request to request (a cached, frozen results view),
// serialized once instead of on every page: SvelteKit's transport hook (src/hooks.ts) sends a
// packed value as the text devalue made of it when it was packed, and the browser parses it
// back with devalue, so it arrives exactly as if SvelteKit had serialized it itself. On the
// server, pages render from the value itself. Universal: the browser decodes with it.
import { parse, stringify } from 'devalue';

const texts = new WeakMap<object, string>();

/**
 * A curve or a frequency grid: a run of finite numbers, none of them −0. Written as JSON text it
 * comes back exactly (JSON keeps every double; it is only −0, NaN and ±∞ it cannot), and takes
 * one entry of devalue's table instead of one per number.
 */
const isNumberRun = (v: unknown): v is number[] => Array.isArray(v) && v.length >= 8 && v.every((x) => typeof x === 'number' && Number.isFinite(x) && !Object.is(x, -0));
const reducers = { Numbers: (v: unknown) => isNumberRun(v) && JSON.stringify(v) };
const revivers = { Numbers: (text: string) => JSON.parse(text) as number[] };

/** Serialize a value now, for every page that sends it later; it must not change afterwards (freeze it). */
export function pack<T extends object>(value: T): T {
	if (!texts.has(value)) texts.set(value, stringify(value, reducers));
	return value;
}

/** The transporter of packed values. */
export const packedTransport = {
	encode: (value: unknown): string | false => (typeof value === 'object' && value !== null && texts.get(value)) || false,
	decode: (text: string): unknown => parse(text, revivers)
};
