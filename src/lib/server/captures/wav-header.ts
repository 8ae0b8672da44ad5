// The WAV header reader (src/lib/captures/wav-header.ts) with a source over files on disk.
import { open } from 'node:fs/promises';
import type { RangeSource } from '../../captures/wav-header';

export * from '../../captures/wav-header';

/** A source over a file on disk; `close()` when done. */
export async function fileSource(path: string): Promise<RangeSource & { close(): Promise<void> }> {
	const handle = await open(path, 'r');
	const { size } = await handle.stat();
	return {
		size,
		async read(offset, length) {
			const buffer = new Uint8Array(Math.max(0, Math.min(length, size - offset)));
			const { bytesRead } = await handle.read(buffer, 0, buffer.length, offset);
			return buffer.subarray(0, bytesRead);
		},
		close: () => handle.close()
	};
}
