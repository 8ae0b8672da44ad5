// The input of one take, assembled from the blocks the capture worklet posts. Each block carries
// the audio context's frame at which it was captured, so the recording keeps the same clock as
// the playback scheduled on that context: recording index i is context frame startFrame + i.
// A block that arrives late or never (the page was busy) leaves zeros and is counted, so a take
// with gaps is refused rather than averaged.

export interface CapturedBlock {
	/** Context frame of the block's first sample. */
	frame: number;
	/** One array per input channel, all the same length. */
	channels: Float32Array[];
}

export class TakeRecording {
	/** Context frame of recording index 0 (the first block's). */
	startFrame: number | null = null;
	/** Frames written so far (including gaps). */
	length = 0;
	/** Frames that never arrived and were left as zeros. */
	missingFrames = 0;
	channelCount = 0;
	private data: Float32Array[] = [];

	constructor(private readonly capacityHint = 1 << 16) {}

	push(block: CapturedBlock): void {
		const n = block.channels[0]?.length ?? 0;
		if (n === 0) return;
		if (this.startFrame === null) {
			this.startFrame = block.frame;
			this.channelCount = block.channels.length;
			this.data = block.channels.map(() => new Float32Array(Math.max(this.capacityHint, n)));
		}
		const at = block.frame - this.startFrame;
		if (at + n <= this.length) return; // a block already written (or from before the start)
		const skip = Math.max(0, this.length - at); // overlap with what is written
		if (at > this.length) this.missingFrames += at - this.length;
		this.reserve(at + n);
		for (let c = 0; c < this.channelCount; c++) {
			// A block with fewer channels than the first (a device change) leaves zeros there.
			const source = block.channels[c];
			if (source) this.data[c].set(source.subarray(skip), at + skip);
		}
		this.length = at + n;
	}

	private reserve(n: number): void {
		if (n <= this.data[0].length) return;
		let size = this.data[0].length;
		while (size < n) size *= 2;
		this.data = this.data.map((old) => {
			const grown = new Float32Array(size);
			grown.set(old.subarray(0, this.length));
			return grown;
		});
	}

	/** The recording of one channel so far, as doubles for the engine. */
	channel(c: number): Float64Array {
		if (!(c >= 0 && c < this.channelCount)) throw new RangeError(`the input has ${this.channelCount} channel(s); channel ${c} does not exist`);
		return Float64Array.from(this.data[c].subarray(0, this.length));
	}

	/** Recording index of a context frame. */
	indexOf(frame: number): number {
		if (this.startFrame === null) throw new Error('nothing has been recorded yet');
		return frame - this.startFrame;
	}
}
