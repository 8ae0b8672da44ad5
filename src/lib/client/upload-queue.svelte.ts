// A batch of files waiting to be uploaded from the visit page, each with its own labels,
// progress and state. The steps per file: hash → announce (server validates, creates the
// capture, presigns) → PUT to storage with progress → confirm (server checks, queues).
import { apiFetch, ApiFailure, putWithProgress, sha256Hex } from './api';
import { readWavHeader, WavHeaderError, type RangeSource } from '$lib/captures/wav-header';
import { sweepMismatch, type PlayedSweep } from '$lib/captures/sweep-fit';

export type ItemState = 'ready' | 'hashing' | 'announcing' | 'uploading' | 'confirming' | 'done' | 'duplicate' | 'error';

export interface UploadItem {
	key: number;
	file: File;
	position: string; // "id:12" for an existing position or "new:P4"
	kind: 'impulse' | 'sweep';
	sweep: string; // "id:3" (test signal) or "file" (reference uploaded alongside)
	reference: File | null;
	channel: number;
	state: ItemState;
	progress: number;
	message: string | null;
	/** The recording's length from its header, once read in the browser; null if unknown. */
	recordingS: number | null;
	/** A capture announced for this file whose upload failed and could not be withdrawn yet. */
	unfinished: number | null;
	/** The capture this file became, once uploaded and confirmed. */
	captureId: number | null;
}

/** A picked file read by ranges, like a stored object on the server. */
function fileSource(file: File): RangeSource {
	return { size: file.size, read: async (offset, length) => new Uint8Array(await file.slice(offset, offset + length).arrayBuffer()) };
}

/** The played sweeps a visit's uploads can name, with their lengths. */
export type SweepChoice = PlayedSweep & { id: number };

/** Why a recorded sweep cannot be of its chosen test signal (known from the file's header), or null. */
export function itemSweepMismatch(item: UploadItem, sweeps: readonly SweepChoice[]): string | null {
	if (item.kind !== 'sweep' || item.recordingS === null || !item.sweep.startsWith('id:')) return null;
	const sweep = sweeps.find((s) => s.id === Number(item.sweep.slice(3)));
	return sweep ? sweepMismatch(item.recordingS, sweep) : null;
}

interface Announced {
	capture: { id: number };
	upload: { url: string; headers: Record<string, string> };
	referenceUpload: { url: string; headers: Record<string, string> } | null;
}

let nextKey = 1;

/** A position label guessed from a file name like "P3-sweep.wav" or "pos_2.wav". */
export function guessPositionLabel(filename: string): string | null {
	const m = filename.match(/(?:^|[^a-z])(?:p|pos|position)[ _-]?(\d{1,3})(?!\d)/i);
	return m ? `P${Number(m[1])}` : null;
}

export class UploadQueue {
	items = $state<UploadItem[]>([]);
	busy = $state(false);

	constructor(
		private readonly sessionId: number,
		private readonly defaults: () => { positions: { id: number; label: string }[]; sweeps: SweepChoice[] }
	) {}

	add(files: FileList | File[]): void {
		const { positions, sweeps } = this.defaults();
		const sweepIds = sweeps.map((s) => s.id);
		// Files without a position in their name get the next free labels, one each.
		const taken = new Set([...positions.map((p) => p.label), ...this.items.map((i) => i.position.replace(/^new:/, ''))]);
		const nextFree = () => {
			let n = 1;
			while (taken.has(`P${n}`)) n++;
			taken.add(`P${n}`);
			return `P${n}`;
		};
		for (const file of files) {
			const guessed = guessPositionLabel(file.name);
			const existing = positions.find((p) => p.label === guessed);
			const looksLikeSweep = /sweep|sine|ess/i.test(file.name) && sweepIds.length > 0;
			const key = nextKey++;
			this.items.push({
				key,
				file,
				position: existing ? `id:${existing.id}` : `new:${guessed ?? nextFree()}`,
				kind: looksLikeSweep ? 'sweep' : 'impulse',
				sweep: sweepIds.length ? `id:${sweepIds[0]}` : 'file',
				reference: null,
				channel: 0,
				state: 'ready',
				progress: 0,
				message: file.name.toLowerCase().endsWith('.wav') ? null : 'Only WAV files can be analysed.',
				recordingS: null,
				unfinished: null,
				captureId: null
			});
			void this.readLength(key, file);
		}
	}

	/** Read the file's header in the browser: its length for the sweep check, or why it is no WAV. */
	private async readLength(key: number, file: File): Promise<void> {
		try {
			const header = await readWavHeader(fileSource(file), { maxDurationS: Number.POSITIVE_INFINITY });
			const item = this.items.find((i) => i.key === key);
			if (item) item.recordingS = header.durationS;
		} catch (e) {
			const item = this.items.find((i) => i.key === key);
			if (item && e instanceof WavHeaderError && item.state === 'ready') item.message = e.message;
		}
	}

	remove(key: number): void {
		this.items = this.items.filter((i) => i.key !== key);
	}

	clearFinished(): void {
		this.items = this.items.filter((i) => i.state !== 'done' && i.state !== 'duplicate');
	}

	get waiting(): UploadItem[] {
		return this.items.filter((i) => i.state === 'ready' || i.state === 'error');
	}

	/** Upload every waiting file, two at a time; `onSettled` runs after each confirmed one. */
	async uploadAll(onSettled: () => void): Promise<void> {
		this.busy = true;
		const { sweeps } = this.defaults();
		// A recording that cannot be of its chosen sweep stays here with the reason, unsent.
		const queue = this.waiting.filter((item) => {
			const mismatch = itemSweepMismatch(item, sweeps);
			if (mismatch) Object.assign(item, { state: 'error', message: mismatch });
			return !mismatch;
		});
		const lane = async () => {
			for (let item = queue.shift(); item; item = queue.shift()) {
				await this.uploadOne(item);
				onSettled();
			}
		};
		await Promise.all([lane(), lane()]);
		this.busy = false;
	}

	/**
	 * Take back a capture whose file never arrived: its row, any part already stored, and a new
	 * position made for it alone go (the server does that in one step). A file the server already
	 * refused is gone (404). False while the server cannot be reached: try again before the next send.
	 */
	private async withdraw(captureId: number): Promise<boolean> {
		try {
			await apiFetch(`/api/captures/${captureId}`, { method: 'DELETE' });
			return true;
		} catch (e) {
			return e instanceof ApiFailure && e.status === 404;
		}
	}

	private async uploadOne(item: UploadItem): Promise<void> {
		const set = (patch: Partial<UploadItem>) => Object.assign(item, patch);
		let announcedId: number | null = null;
		try {
			// What a failed try left behind goes first, or it would be taken for this same file.
			if (item.unfinished !== null) {
				if (!(await this.withdraw(item.unfinished))) throw new Error('The earlier try of this file could not be taken back yet: check the connection and try again.');
				set({ unfinished: null });
			}
			set({ state: 'hashing', message: null, progress: 0 });
			const sha256 = await sha256Hex(item.file);
			set({ state: 'announcing' });
			const [how, value] = item.position.split(/:(.*)/s);
			const body: Record<string, unknown> = {
				filename: item.file.name,
				sizeBytes: item.file.size,
				sha256,
				kind: item.kind,
				channel: item.channel
			};
			if (how === 'id') body.positionId = Number(value);
			else body.newPositionLabel = value;
			if (item.kind === 'sweep') {
				if (item.sweep.startsWith('id:')) body.sweepDefinitionId = Number(item.sweep.slice(3));
				else if (item.reference) body.reference = { filename: item.reference.name, sizeBytes: item.reference.size };
			}
			const announced = await apiFetch<Announced>(`/api/sessions/${this.sessionId}/captures`, { method: 'POST', body: JSON.stringify(body) });
			announcedId = announced.capture.id;
			set({ state: 'uploading' });
			const refShare = announced.referenceUpload && item.reference ? item.reference.size / (item.reference.size + item.file.size) : 0;
			await putWithProgress(announced.upload.url, item.file, announced.upload.headers, (f) => set({ progress: f * (1 - refShare) }));
			if (announced.referenceUpload && item.reference) {
				await putWithProgress(announced.referenceUpload.url, item.reference, announced.referenceUpload.headers, (f) => set({ progress: 1 - refShare + f * refShare }));
			}
			set({ state: 'confirming', progress: 1 });
			await apiFetch(`/api/captures/${announced.capture.id}/uploaded`, { method: 'POST' });
			set({ state: 'done', message: 'Uploaded — queued for analysis.', captureId: announced.capture.id });
		} catch (e) {
			if (e instanceof ApiFailure && e.status === 409 && e.body.duplicateOf) {
				set({ state: 'duplicate', message: e.message });
				return;
			}
			// Announced but not confirmed: take the capture back, so the visit keeps no half-made
			// capture (nor a new position made for it) and the file can be sent again.
			if (announcedId !== null && !(await this.withdraw(announcedId))) set({ unfinished: announcedId });
			set({ state: 'error', message: e instanceof ApiFailure ? e.detail : (e as Error).message });
		}
	}
}
