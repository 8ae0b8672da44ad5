import { json } from '@sveltejs/kit';
import { authorize } from '$lib/server/auth/access';
import { loadRoomPlan } from '$lib/server/plans/load';
import type { RequestHandler } from './$types';

/** The room's plan worked through: items, predicted T per band, predicted vs measured, cost (staff only). */
export const GET: RequestHandler = async ({ locals, params }) => {
	const roomId = Number(params.roomId);
	const scope = await authorize(locals, 'project:internal', { roomId });
	const view = await loadRoomPlan(scope, roomId);
	return json({
		room: { id: view.room.id, name: view.room.name, lengthM: view.room.lengthM, widthM: view.room.widthM, heightM: view.room.heightM },
		plan: view.plan,
		before: view.before,
		after: view.after,
		evaluation: view.evaluation,
		cost: view.cost
	});
};
