// A batch of files waiting to be uploaded from the visit page, each with its own labels,
// progress and state. The steps per file: hash → announce (server validates, creates the
// capture, presigns) → PUT to storage with progress → confirm (server checks, queues).
import { apiFetch, ApiFailure, putWithProgress, sha256Hex } from './api';

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
		private readonly defaults: () => { positions: { id: number; label: string }[]; sweepIds: number[] }
	) {}

	add(files: FileList | File[]): void {
		const { positions, sweepIds } = this.defaults();
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
			this.items.push({
				key: nextKey++,
				file,
				position: existing ? `id:${existing.id}` : `new:${guessed ?? nextFree()}`,
				kind: looksLikeSweep ? 'sweep' : 'impulse',
				sweep: sweepIds.length ? `id:${sweepIds[0]}` : 'file',
				reference: null,
				channel: 0,
				state: 'ready',
				progress: 0,
				message: file.name.toLowerCase().endsWith('.wav') ? null : 'Only WAV files can be analysed.'
			});
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
		const queue = [...this.waiting];
		const lane = async () => {
			for (let item = queue.shift(); item; item = queue.shift()) {
				await this.uploadOne(item);
				onSettled();
			}
		};
		await Promise.all([lane(), lane()]);
		this.busy = false;
	}

	private async uploadOne(item: UploadItem): Promise<void> {
		const set = (patch: Partial<UploadItem>) => Object.assign(item, patch);
		try {
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
			set({ state: 'uploading' });
			const refShare = announced.referenceUpload && item.reference ? item.reference.size / (item.reference.size + item.file.size) : 0;
			await putWithProgress(announced.upload.url, item.file, announced.upload.headers, (f) => set({ progress: f * (1 - refShare) }));
			if (announced.referenceUpload && item.reference) {
				await putWithProgress(announced.referenceUpload.url, item.reference, announced.referenceUpload.headers, (f) => set({ progress: 1 - refShare + f * refShare }));
			}
			set({ state: 'confirming', progress: 1 });
			await apiFetch(`/api/captures/${announced.capture.id}/uploaded`, { method: 'POST' });
			set({ state: 'done', message: 'Uploaded — queued for analysis.' });
		} catch (e) {
			if (e instanceof ApiFailure && e.status === 409 && e.body.duplicateOf) {
				set({ state: 'duplicate', message: e.message });
				return;
			}
			set({ state: 'error', message: e instanceof ApiFailure ? e.detail : (e as Error).message });
		}
	}
}
