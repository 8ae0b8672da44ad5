import { authorize } from '$lib/server/auth/access';
import { db } from '$lib/server/db';
import { getCapture } from '$lib/server/queries/captures';
import { getSession } from '$lib/server/queries/sessions';
import { getRoom } from '$lib/server/queries/rooms';
import { getProject } from '$lib/server/queries/projects';
import { getPosition } from '$lib/server/queries/positions';
import { listProblemBands } from '$lib/server/queries/reviews';
import { toView } from '$lib/server/captures/views';
import { analysisSummaries } from '$lib/server/queries/captures';
import type { PageServerLoad } from './$types';

// The page shell; the charts' data comes from /api/captures/[id]/analysis in the browser.
export const load = (async ({ locals, params }) => {
	const captureId = Number(params.captureId);
	await authorize(locals, 'project:internal', { captureId });
	const k = db();
	const capture = (await getCapture(k, captureId))!;
	const session = (await getSession(k, capture.sessionId))!;
	const room = (await getRoom(k, session.roomId))!;
	const project = (await getProject(k, room.projectId))!;
	const position = await getPosition(k, capture.positionId);
	return {
		capture: toView(capture, (await analysisSummaries(k, [captureId])).get(captureId)),
		session: { id: session.id, conditionLabel: session.conditionLabel, measuredOn: session.measuredOn },
		room: { id: room.id, name: room.name, lengthM: room.lengthM, widthM: room.widthM, heightM: room.heightM, volumeM3: room.volumeM3, roomUse: room.roomUse },
		project: { id: project.id, name: project.name },
		positionHasCoordinates: Boolean(position?.source && position?.mic),
		problemBands: await listProblemBands(k, room.id)
	};
}) satisfies PageServerLoad;
