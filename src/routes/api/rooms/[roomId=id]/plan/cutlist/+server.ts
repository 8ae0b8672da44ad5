import { authorize } from '$lib/server/auth/access';
import { download, exportFormat } from '$lib/server/exports';
import { loadRoomPlan } from '$lib/server/plans/load';
import { planUnit } from '$lib/server/plans/units';
import { separateParts } from '$lib/plans/build';
import { CUT_LIST_SCHEMA, cutListCsv, cutPieceRows } from '$lib/plans/exports';
import type { RequestHandler } from './$types';

/** Every piece of the plan with its sheet and place on it, as CSV (?units=in adds inch columns) or JSON (staff only). */
export const GET: RequestHandler = async ({ locals, params, url }) => {
	const roomId = Number(params.roomId);
	const scope = await authorize(locals, 'project:internal', { roomId });
	const format = exportFormat(url);
	const view = await loadRoomPlan(scope, roomId);
	const rows = cutPieceRows(view.cut.ok ? view.cut.cutList : null, separateParts(view.builds));
	return download(
		format,
		`${view.room.name}-cut-list`,
		() => cutListCsv(rows, planUnit(url.searchParams, scope)),
		() => ({
			schema: CUT_LIST_SCHEMA,
			room: view.room.name,
			kerfMm: view.plan.settings.kerfMm,
			problem: view.cut.ok ? null : view.cut.error,
			sheets: view.cut.ok ? view.cut.cutList.perStock : [],
			yieldPct: view.cut.ok ? view.cut.cutList.yieldPct : null,
			pieces: rows
		})
	);
};
