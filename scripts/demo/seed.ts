// Seeds the demo scenario once; running it again leaves existing data as it is.
import type { Knex } from 'knex';
import { hashPassword } from '../../src/lib/server/auth/password';
import { DEMO_ORGANIZATION, DEMO_PASSWORD, DEMO_PROJECTS, DEMO_USERS } from './scenario';
import { seedDemoImperialPlan, seedDemoPlan } from './seed-plan';

export interface SeedResult {
	created: boolean;
	organizationId: number;
}

export async function seedDemo(k: Knex): Promise<SeedResult> {
	const existing = await k('organizations').where({ slug: DEMO_ORGANIZATION.slug }).first('id');
	if (existing) return { created: false, organizationId: existing.id };

	const passwordHash = await hashPassword(DEMO_PASSWORD);
	return k.transaction(async (trx) => {
		const [organizationId] = await trx('organizations').insert(DEMO_ORGANIZATION);
		const userIds = new Map<string, number>();
		for (const u of DEMO_USERS) {
			const [id] = await trx('users').insert({ email: u.email, name: u.name, password_hash: passwordHash });
			userIds.set(u.email, id);
			await trx('memberships').insert({ user_id: id, organization_id: organizationId, role: u.role });
		}
		const acousticianId = userIds.get('acoustician@fenwick-hale.test')!;
		for (const p of DEMO_PROJECTS) {
			const [projectId] = await trx('projects').insert({
				organization_id: organizationId,
				name: p.name,
				client_name: p.clientName,
				description: p.description
			});
			await trx('project_members').insert({ project_id: projectId, user_id: userIds.get(p.clientEmail)! });
			const [roomId] = await trx('rooms').insert({
				project_id: projectId,
				name: p.room.name,
				length_m: p.room.lengthM,
				width_m: p.room.widthM,
				height_m: p.room.heightM,
				room_use: p.room.roomUse,
				notes: p.room.notes
			});
			for (const s of p.sessions) {
				const [sessionId] = await trx('sessions').insert({
					room_id: roomId,
					condition_label: s.conditionLabel,
					measured_on: s.measuredOn,
					notes: s.notes,
					acoustician_id: acousticianId
				});
				for (const pos of p.positions) {
					await trx('positions').insert({
						session_id: sessionId,
						label: pos.label,
						source_label: pos.sourceLabel,
						mic_label: pos.micLabel,
						source_x_m: pos.source.x,
						source_y_m: pos.source.y,
						source_z_m: pos.source.z,
						mic_x_m: pos.mic.x,
						mic_y_m: pos.mic.y,
						mic_z_m: pos.mic.z
					});
				}
			}
		}
		// The first project's room has been reviewed and treated: problem bands and a plan.
		const [lindqvist] = await trx('rooms as r').join('projects as p', 'p.id', 'r.project_id').where({ 'p.organization_id': organizationId, 'p.name': DEMO_PROJECTS[0].name }).select('r.id');
		const sessions = await trx('sessions').where({ room_id: lindqvist.id }).orderBy('measured_on').select('id');
		await seedDemoPlan(trx, { roomId: lindqvist.id, consultantId: userIds.get('consultant@fenwick-hale.test')!, baselineSessionId: sessions[0].id, afterSessionId: sessions[1].id });
		// The second client's basement is planned in inches, built from 4 × 8 ft sheets.
		const [okafor] = await trx('rooms as r').join('projects as p', 'p.id', 'r.project_id').where({ 'p.organization_id': organizationId, 'p.name': DEMO_PROJECTS[1].name }).select('r.id');
		const okaforSessions = await trx('sessions').where({ room_id: okafor.id }).orderBy('measured_on').select('id');
		await seedDemoImperialPlan(trx, { roomId: okafor.id, consultantId: userIds.get('consultant@fenwick-hale.test')!, baselineSessionId: okaforSessions[0].id });
		return { created: true, organizationId };
	});
}
