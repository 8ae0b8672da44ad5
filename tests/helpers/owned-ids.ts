import type { Knex } from 'knex';
import { randomUUID } from 'node:crypto';
import type { ProjectTree } from './factories';

/**
 * Ids of everything a project tree owns, keyed by the route parameter names that take them.
 * Rows that later features add are created here, so access tests reach those routes too.
 */
export async function ownedIds(k: Knex, t: ProjectTree): Promise<Record<string, number | string>> {
	const project = await k('projects').where({ id: t.projectId }).first('organization_id');
	const [captureId] = await k('captures').insert({
		session_id: t.sessionId,
		position_id: t.positionId,
		kind: 'impulse',
		original_filename: 'owned.wav',
		object_key: `captures/${randomUUID()}.wav`,
		status: 'awaiting_upload'
	});
	const [sweepId] = await k('sweep_definitions').insert({
		organization_id: project.organization_id,
		name: 'owned sweep',
		f1_hz: 20,
		f2_hz: 20000,
		duration_s: 5,
		fade_in_s: 0.05,
		fade_out_s: 0.05,
		silence_s: 2,
		sample_rate: 48000,
		bit_depth: '24',
		level_dbfs: -6,
		object_key: `sweeps/${randomUUID()}.wav`
	});
	const [laterSessionId] = await k('sessions').insert({ room_id: t.roomId, condition_label: 'treated', measured_on: '2026-11-20' });
	const [comparisonId] = await k('comparisons').insert({ room_id: t.roomId, baseline_session_id: t.sessionId, treated_session_id: laterSessionId, title: 'owned comparison', published_at: new Date() });
	const photoName = randomUUID();
	const [photoId] = await k('visit_photos').insert({
		session_id: t.sessionId,
		position_id: t.positionId,
		caption: 'owned photo',
		display_key: `photos/${photoName}.jpg`,
		thumb_key: `photos/${photoName}-thumb.jpg`,
		content_type: 'image/jpeg',
		width: 640,
		height: 480,
		thumb_width: 480,
		thumb_height: 360,
		display_bytes: 1000,
		thumb_bytes: 500,
		original_filename: 'owned.jpg',
		original_type: 'image/jpeg',
		original_bytes: 2000,
		original_width: 640,
		original_height: 480
	});
	return { projectId: t.projectId, roomId: t.roomId, sessionId: t.sessionId, positionId: t.positionId, captureId, sweepId, comparisonId, photoId };
}
