// The demo visits' records: a picture of the room from the door and one of the microphone at the
// main seat, drawn from shapes (invented, like the rest of the demo) and sent through the app's
// own photo service as an upload would be; and a note on one capture of each visit.
import sharp from 'sharp';
import type { Knex } from 'knex';
import { addPhoto } from '../../src/lib/server/photos/service';
import { setCaptureNote } from '../../src/lib/server/captures/service';
import type { Scope } from '../../src/lib/server/auth/access';

const W = 1200, H = 900;

/** The attic room seen from the door: back wall with two loudspeakers, a sofa; panels when treated. */
function roomSvg(o: { treated: boolean; micAtSeat: boolean }): string {
	const panels = o.treated
		? [170, 430, 690, 950].map((x) => `<rect x="${x}" y="150" width="90" height="260" rx="6" fill="#5d6b7a"/>`).join('') +
			`<rect x="420" y="40" width="360" height="70" rx="6" fill="#6e7c8b"/>` +
			`<polygon points="0,120 120,200 120,560 0,700" fill="#55606c"/><polygon points="1200,120 1080,200 1080,560 1200,700" fill="#55606c"/>`
		: '';
	const speaker = (x: number) =>
		`<rect x="${x}" y="330" width="110" height="190" rx="8" fill="#22262b"/><circle cx="${x + 55}" cy="380" r="22" fill="#3b4148"/><circle cx="${x + 55}" cy="465" r="38" fill="#3b4148"/>` +
		`<rect x="${x + 35}" y="520" width="40" height="110" fill="#30353b"/><rect x="${x + 10}" y="625" width="90" height="12" fill="#30353b"/>`;
	const mic = o.micAtSeat
		? `<line x1="640" y1="860" x2="640" y2="600" stroke="#1d2024" stroke-width="9"/><line x1="640" y1="860" x2="580" y2="895" stroke="#1d2024" stroke-width="7"/>` +
			`<line x1="640" y1="860" x2="700" y2="895" stroke="#1d2024" stroke-width="7"/><rect x="631" y="540" width="18" height="70" rx="8" fill="#9aa3ab"/>`
		: '';
	return `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">
	<defs>
		<linearGradient id="wall" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#e9e2d4"/><stop offset="1" stop-color="#cfc6b4"/></linearGradient>
		<linearGradient id="floor" x1="0" y1="0" x2="0" y2="1"><stop offset="0" stop-color="#a57c55"/><stop offset="1" stop-color="#7a5637"/></linearGradient>
		<linearGradient id="slope" x1="0" y1="0" x2="1" y2="0"><stop offset="0" stop-color="#d8d0bf"/><stop offset="1" stop-color="#c2b9a6"/></linearGradient>
	</defs>
	<rect width="${W}" height="${H}" fill="url(#slope)"/>
	<polygon points="120,200 1080,200 1080,640 120,640" fill="url(#wall)"/>
	<polygon points="0,0 1200,0 1080,200 120,200" fill="#efe9de"/>
	<polygon points="120,640 1080,640 1200,900 0,900" fill="url(#floor)"/>
	<polygon points="0,0 120,200 120,640 0,900" fill="#cbc2ae"/><polygon points="1200,0 1080,200 1080,640 1200,900" fill="#bfb6a2"/>
	<rect x="520" y="235" width="160" height="110" fill="#9fc3dd" stroke="#f4f1ea" stroke-width="10"/>
	${panels}
	${speaker(240)}${speaker(850)}
	<rect x="380" y="700" width="440" height="120" rx="26" fill="#4f6d7a"/><rect x="360" y="660" width="480" height="70" rx="26" fill="#5d7f8d"/>
	${mic}
</svg>`;
}

async function photo(svg: string, name: string): Promise<File> {
	const jpeg = await sharp(Buffer.from(svg)).jpeg({ quality: 88 }).toBuffer();
	return new File([new Uint8Array(jpeg)], name, { type: 'image/jpeg' });
}

/** Photos and a capture note for one demo visit; its captures are already created. */
export async function seedDemoVisitRecords(k: Knex, scope: Scope, sessionId: number, treated: boolean): Promise<void> {
	await addPhoto(scope, sessionId, { positionId: null, caption: treated ? 'The room from the door, after treatment: wall panels and a ceiling cloud' : 'The room from the door, before treatment', back: 'visit' }, await photo(roomSvg({ treated, micAtSeat: false }), treated ? 'room-after.jpg' : 'room-before.jpg'));
	const main = await k('positions').where({ session_id: sessionId, label: 'P1' }).first('id');
	if (!main) return;
	await addPhoto(scope, sessionId, { positionId: main.id, caption: 'Microphone at the main seat, ear height 1.05 m', back: 'visit' }, await photo(roomSvg({ treated, micAtSeat: true }), 'p1-mic.jpg'));
	const capture = await k('captures').where({ session_id: sessionId, position_id: main.id }).first('id');
	if (capture) await setCaptureNote(scope, capture.id, treated ? 'Door closed, ventilation off.' : 'Door closed, ventilation off; rain on the roof light during the last sweep.');
}
