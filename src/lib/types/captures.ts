// The JSON shape of a capture for the browser: its state and, once analysed, the headline
// numbers and quality warnings (src/lib/server/captures/views.ts builds it; object keys stay on the server).
import type { CaptureStatus } from '../captures/status';

export interface CaptureView {
	id: number;
	positionId: number;
	positionLabel: string;
	kind: 'impulse' | 'sweep';
	filename: string;
	sizeBytes: number | null;
	sampleRate: number | null;
	channels: number | null;
	channel: number;
	durationS: number | null;
	status: CaptureStatus;
	error: string | null;
	/** The acoustician's or consultant's remark on the capture's conditions ("door open"). */
	note: string | null;
	engineVersion: string | null;
	warnings: { code: string; band: number | null; message: string }[];
	headline: { t30S: number | null; t20S: number | null; edtS: number | null; c80Db: number | null; peakToNoiseDb: number | null } | null;
	updatedAt: string;
}
