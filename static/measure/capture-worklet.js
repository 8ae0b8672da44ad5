// Audio worklet of the measurement page: copies the input, block by block, to the page, each
// block stamped with the audio context's frame at which it was captured (the page's playback is
// scheduled on the same clock). Blocks of BLOCK_FRAMES keep the messages few. It produces no
// output. Served from the app itself, so the page's Content-Security-Policy (script-src 'self')
// allows it.
const BLOCK_FRAMES = 2048;

class RingdownCapture extends AudioWorkletProcessor {
	constructor() {
		super();
		this.buffers = null;
		this.filled = 0;
		this.frame = 0;
	}

	flush() {
		if (!this.buffers || this.filled === 0) return;
		const channels = this.buffers.map((b) => b.slice(0, this.filled));
		this.port.postMessage({ frame: this.frame, channels }, channels.map((c) => c.buffer));
		this.filled = 0;
	}

	process(inputs) {
		const input = inputs[0];
		// No channels: the stream delivers nothing this quantum; the page counts the gap.
		if (!input || input.length === 0) return true;
		const n = input[0].length;
		// A quantum that brought nothing leaves a gap: the block so far goes first, so frames stay true.
		const gap = this.filled > 0 && currentFrame !== this.frame + this.filled;
		if (gap || !this.buffers || this.buffers.length !== input.length || this.filled + n > BLOCK_FRAMES) {
			this.flush();
			if (!this.buffers || this.buffers.length !== input.length) this.buffers = input.map(() => new Float32Array(Math.max(BLOCK_FRAMES, n)));
		}
		if (this.filled === 0) this.frame = currentFrame;
		for (let c = 0; c < input.length; c++) this.buffers[c].set(input[c], this.filled);
		this.filled += n;
		if (this.filled >= BLOCK_FRAMES) this.flush();
		return true;
	}
}

registerProcessor('ringdown-capture', RingdownCapture);
