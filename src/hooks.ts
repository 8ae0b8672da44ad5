// Hooks that run on the server and in the browser.
import type { Transport } from '@sveltejs/kit';
import { packedTransport } from '$lib/packed';

// Results views serialized once when cached, not on every request (src/lib/packed.ts).
export const transport: Transport = { Packed: packedTransport };
