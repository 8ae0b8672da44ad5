import { authorize } from '$lib/server/auth/access';
import { formAction } from '$lib/server/forms';
import { calibrate, calibrationPage, fileOf, removePart, setCorrection } from '$lib/server/calibrations/service';
import { getSession } from '$lib/server/queries/sessions';
import { getRoom } from '$lib/server/queries/rooms';
import { db } from '$lib/server/db';
import { calibrateSchema, chainPartSchema, correctionSchema } from '$lib/schemas/calibrations';
import { roleAllows } from '$lib/roles';
import { formatDb } from '$lib/format';
import type { Actions, PageServerLoad } from './$types';

// A visit's input chains: calibrator recordings and microphone correction files. Staff read;
// those who may edit the project (acoustician, consultant) change them.
export const load = (async ({ locals, params }) => {
	const sessionId = Number(params.sessionId);
	const scope = await authorize(locals, 'project:internal', { sessionId });
	const session = (await getSession(db(), sessionId))!;
	const room = (await getRoom(db(), session.roomId))!;
	return {
		session: { id: session.id, conditionLabel: session.conditionLabel, measuredOn: session.measuredOn },
		room: { id: room.id, name: room.name },
		...(await calibrationPage(sessionId)),
		can: { edit: roleAllows(scope.role, 'project:edit') }
	};
}) satisfies PageServerLoad;

export const actions = {
	calibrate: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, calibrateSchema, async (input, formData) => {
			const done = await calibrate(scope, sessionId, input, await fileOf(formData));
			return { formId: 'calibrate', saved: `Calibrated: dB SPL = dBFS + ${formatDb(done.offsetDb)} dB. ${done.queued} capture${done.queued === 1 ? '' : 's'} queued to be analysed again.` };
		});
	},
	correct: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, correctionSchema, async (input, formData) => {
			const done = await setCorrection(scope, sessionId, input, await fileOf(formData));
			return { formId: 'correct', saved: `Correction of ${done.points} points stored. ${done.queued} capture${done.queued === 1 ? '' : 's'} queued to be analysed again.` };
		});
	},
	removeCalibration: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, chainPartSchema, async (input) => {
			const done = await removePart(scope, sessionId, input.channel, 'calibration');
			return { formId: 'remove', saved: `Calibration removed. ${done.queued} capture${done.queued === 1 ? '' : 's'} queued to be analysed again.` };
		});
	},
	removeCorrection: async ({ locals, params, request }) => {
		const sessionId = Number(params.sessionId);
		const scope = await authorize(locals, 'project:edit', { sessionId });
		return formAction(request, chainPartSchema, async (input) => {
			const done = await removePart(scope, sessionId, input.channel, 'correction');
			return { formId: 'remove', saved: `Correction removed. ${done.queued} capture${done.queued === 1 ? '' : 's'} queued to be analysed again.` };
		});
	}
} satisfies Actions;
