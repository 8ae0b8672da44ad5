// The visit's captures, kept fresh while any is still uploading, queued or being analysed:
// polling with back-off (0.5 s doubling to 5 s), reset whenever something changes.
import type { CaptureView } from '$lib/types/captures';
import { isPendingStatus } from '$lib/captures/status';
import { apiFetch } from './api';

const FIRST_DELAY_MS = 500;
const MAX_DELAY_MS = 5_000;

export class LiveCaptures {
	captures = $state<CaptureView[]>([]);
	pending = $state(0);
	error = $state<string | null>(null);
	private timer: ReturnType<typeof setTimeout> | null = null;
	private delay = FIRST_DELAY_MS;
	private stopped = false;

	constructor(
		private readonly sessionId: number,
		initial: CaptureView[]
	) {
		this.captures = initial;
		this.pending = initial.filter(isPending).length;
	}

	/** Start (or restart quickly) polling; it stops by itself once nothing is pending. */
	poke(): void {
		this.delay = FIRST_DELAY_MS;
		this.schedule(0);
	}

	stop(): void {
		this.stopped = true;
		if (this.timer) clearTimeout(this.timer);
	}

	private schedule(ms: number): void {
		if (this.stopped) return;
		if (this.timer) clearTimeout(this.timer);
		this.timer = setTimeout(() => void this.refresh(), ms);
	}

	async refresh(): Promise<void> {
		try {
			const before = JSON.stringify(this.captures.map((c) => [c.id, c.status]));
			const r = await apiFetch<{ captures: CaptureView[]; pending: number }>(`/api/sessions/${this.sessionId}/captures`);
			this.captures = r.captures;
			this.pending = r.pending;
			this.error = null;
			const changed = before !== JSON.stringify(r.captures.map((c) => [c.id, c.status]));
			this.delay = changed ? FIRST_DELAY_MS : Math.min(MAX_DELAY_MS, this.delay * 2);
		} catch (e) {
			this.error = (e as Error).message;
			this.delay = MAX_DELAY_MS;
		}
		if (this.pending > 0) this.schedule(this.delay);
	}
}

export function isPending(c: CaptureView): boolean {
	return isPendingStatus(c.status);
}
