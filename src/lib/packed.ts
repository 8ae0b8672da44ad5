// Page data that stays the same from request to request (a cached, frozen results view),
// serialized once instead of on every page: SvelteKit's transport hook (src/hooks.ts) sends a
// packed value as the text devalue made of it when it was packed, and the browser parses it
// back with devalue, so it arrives exactly as if SvelteKit had serialized it itself. On the
// server, pages render from the value itself. Universal: the browser decodes with it.
import { parse, stringify } from 'devalue';

const texts = new WeakMap<object, string>();

/** Serialize a value now, for every page that sends it later; it must not change afterwards (freeze it). */
export function pack<T extends object>(value: T): T {
	if (!texts.has(value)) texts.set(value, stringify(value));
	return value;
}

/** The transporter of packed values. */
export const packedTransport = {
	encode: (value: unknown): string | false => (typeof value === 'object' && value !== null && texts.get(value)) || false,
	decode: (text: string): unknown => parse(text)
};
