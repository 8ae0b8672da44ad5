// The states of a capture, shared by the server (queries, jobs, API) and the visit page.

export const CAPTURE_STATUSES = ['awaiting_upload', 'queued', 'analysing', 'analysed', 'failed'] as const;
export type CaptureStatus = (typeof CAPTURE_STATUSES)[number];

/** States in which work on the capture is still to come: the visit page keeps polling, the finished-visit mail waits. */
export const PENDING_CAPTURE_STATUSES = ['awaiting_upload', 'queued', 'analysing'] as const satisfies readonly CaptureStatus[];

export function isPendingStatus(status: CaptureStatus): boolean {
	return (PENDING_CAPTURE_STATUSES as readonly CaptureStatus[]).includes(status);
}
