// The measurement page: what an acoustician needs to play a test signal and record it on a visit
// — its positions, the practice's test signals with their definitions (the browser plays the
// stored WAV and needs its sweep law), and the visit's captures to follow their analysis.
import { db } from '../db';
import type { Scope } from '../auth/access';
import { listPositions } from '../queries/positions';
import { getProject } from '../queries/projects';
import { getRoom } from '../queries/rooms';
import { getSession } from '../queries/sessions';
import { listSweeps } from '../queries/sweeps';
import { sessionCaptureViews } from '../captures/views';
import type { MeasureSignal } from '../../types/measure';

export async function measurePage(scope: Scope, sessionId: number) {
	const k = db();
	const session = (await getSession(k, sessionId))!;
	const room = (await getRoom(k, session.roomId))!;
	const [project, positions, sweeps, captures] = await Promise.all([
		getProject(k, room.projectId),
		listPositions(k, sessionId),
		listSweeps(k, scope.organizationId),
		sessionCaptureViews(k, sessionId)
	]);
	return {
		session: { id: session.id, conditionLabel: session.conditionLabel, measuredOn: session.measuredOn },
		room: { id: room.id, name: room.name },
		project: { id: project!.id, name: project!.name },
		positions: positions.map((p) => ({ id: p.id, label: p.label })),
		signals: sweeps.map(
			(s): MeasureSignal => ({ id: s.id, name: s.name, f1Hz: s.f1Hz, f2Hz: s.f2Hz, durationS: s.durationS, silenceS: s.silenceS, sampleRate: s.sampleRate, levelDbfs: s.levelDbfs })
		),
		captures
	};
}
