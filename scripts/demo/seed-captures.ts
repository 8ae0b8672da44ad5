// Sends the demo room's synthetic impulse responses through the real capture pipeline: create
// the capture, PUT the file to the presigned URL, confirm — the worker then analyses them.
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import { encodeWav } from '../../src/lib/analysis';
import { confirmUpload, createCapture } from '../../src/lib/server/captures/service';
import type { Scope } from '../../src/lib/server/auth/access';
import { synthesiseResponse, TREATED, UNTREATED } from './room-response';
import { DEMO_PROJECTS } from './scenario';
import { seedDemoCalibration } from './seed-calibration';
import { seedDemoVisitRecords } from './seed-photos';
import { createSweep } from '../../src/lib/server/sweeps/service';
import { sweepDefinitionSchema } from '../../src/lib/schemas/captures';

export async function seedDemoCaptures(k: Knex, organizationId: number): Promise<number> {
	const acoustician = await k('users').where({ email: 'acoustician@fenwick-hale.test' }).first('id', 'email', 'name');
	const scope: Scope = {
		organizationId,
		projectId: null,
		role: 'acoustician',
		user: { id: acoustician.id, email: acoustician.email, name: acoustician.name, unitSystem: 'metric' }
	};
	// The practice's own test signal, so measuring in the browser and recorded-sweep uploads have
	// one to choose from the start: 20 Hz – 20 kHz over 5 s at 48 kHz, peaks at −6 dBFS.
	await createSweep(scope, sweepDefinitionSchema.parse({ name: 'Site sweep 20 Hz – 20 kHz, 5 s', sampleRate: 48000, f1Hz: 20, f2Hz: 20000, durationS: 5, levelDbfs: -6, silenceS: 2 }));
	const demo = DEMO_PROJECTS[0];
	const room = { lengthM: demo.room.lengthM, widthM: demo.room.widthM, heightM: demo.room.heightM };
	const sessions = await k('sessions as s')
		.join('rooms as r', 'r.id', 's.room_id')
		.join('projects as p', 'p.id', 'r.project_id')
		.where({ 'p.organization_id': organizationId, 'p.name': demo.name })
		.orderBy('s.measured_on')
		.select('s.id', 's.condition_label');
	let count = 0;
	for (const [si, session] of sessions.entries()) {
		const condition = session.condition_label === 'untreated' ? UNTREATED : TREATED;
		// Both visits were measured through the same calibrated chain, so their levels are dB SPL.
		await seedDemoCalibration(scope, session.id);
		const positions = await k('positions').where({ session_id: session.id }).orderBy('label');
		for (const [pi, pos] of positions.entries()) {
			const source = { x: Number(pos.source_x_m), y: Number(pos.source_y_m), z: Number(pos.source_z_m) };
			const mic = { x: Number(pos.mic_x_m), y: Number(pos.mic_y_m), z: Number(pos.mic_z_m) };
			// Each position decays a little differently (±4 %), as real seats do.
			const spread = 1 + 0.04 * (pi - 1);
			const samples = synthesiseResponse(room, source, mic, { ...condition, t60S: condition.t60S.map((t) => t * spread) }, 1000 * (si + 1) + pi);
			const wav = encodeWav(samples, 48_000, 24);
			const filename = `${session.condition_label.replace(/\s+/g, '-')}-${pos.label}-ir.wav`;
			const created = await createCapture(scope, session.id, {
				filename,
				sizeBytes: wav.byteLength,
				sha256: createHash('sha256').update(wav).digest('hex'),
				kind: 'impulse',
				positionId: pos.id,
				channel: 0
			});
			const put = await fetch(created.upload.url, { method: 'PUT', headers: created.upload.headers, body: wav as Uint8Array<ArrayBuffer> });
			if (!put.ok) throw new Error(`Demo upload of ${filename} failed: ${put.status}`);
			await confirmUpload(scope, created.capture.id);
			count++;
		}
		// Photos of the room and the main seat, and a note on that capture.
		await seedDemoVisitRecords(k, scope, session.id, session.condition_label !== 'untreated');
	}
	return count;
}
