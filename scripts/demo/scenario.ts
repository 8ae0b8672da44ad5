// The demo scenario: an invented practice, its people, two clients and their rooms.
// Everything here is made up for the demo; no real person, firm or room.
import type { Role } from '../../src/lib/roles';

export const DEMO_PASSWORD = 'ringdown-demo';

export const DEMO_ORGANIZATION = { name: 'Fenwick & Hale Acoustics', slug: 'fenwick-hale' };

export const DEMO_USERS: { email: string; name: string; role: Role }[] = [
	{ email: 'admin@fenwick-hale.test', name: 'Iris Fenwick', role: 'admin' },
	{ email: 'acoustician@fenwick-hale.test', name: 'Tomas Hale', role: 'acoustician' },
	{ email: 'consultant@fenwick-hale.test', name: 'Noor Achterberg', role: 'consultant' },
	{ email: 'client@fenwick-hale.test', name: 'Marta Lindqvist', role: 'client' },
	{ email: 'other.client@fenwick-hale.test', name: 'Chidi Okafor', role: 'client' }
];

export const DEMO_PROJECTS = [
	{
		name: 'Lindqvist listening room',
		clientName: 'Marta Lindqvist',
		description: 'Stereo listening room in a converted attic: boomy bass and a bright, slappy top end.',
		clientEmail: 'client@fenwick-hale.test',
		room: {
			name: 'Attic listening room',
			lengthM: 6.2,
			widthM: 4.35,
			heightM: 2.7,
			roomUse: 'listening' as const,
			notes: 'Plasterboard on studs, timber floor, one dormer window. Loudspeakers on the short front wall.'
		},
		sessions: [
			{ conditionLabel: 'untreated', measuredOn: '2026-10-06', notes: 'Empty room apart from the sofa and the loudspeakers.' },
			{ conditionLabel: 'after treatment', measuredOn: '2026-11-17', notes: 'Corner bass traps, side-wall absorbers and a rear diffuser installed.' }
		],
		// Loudspeaker and microphone points (x from the front wall, y from the left wall, z up), metres.
		positions: [
			{ label: 'P1', sourceLabel: 'left loudspeaker', micLabel: 'main seat', source: { x: 0.9, y: 1.2, z: 1.1 }, mic: { x: 3.7, y: 2.17, z: 1.05 } },
			{ label: 'P2', sourceLabel: 'left loudspeaker', micLabel: 'seat left', source: { x: 0.9, y: 1.2, z: 1.1 }, mic: { x: 3.9, y: 1.6, z: 1.05 } },
			{ label: 'P3', sourceLabel: 'right loudspeaker', micLabel: 'seat right', source: { x: 0.9, y: 3.15, z: 1.1 }, mic: { x: 3.9, y: 2.8, z: 1.05 } }
		]
	},
	{
		name: 'Okafor home theatre',
		clientName: 'Chidi Okafor',
		description: 'Basement home theatre, early planning.',
		clientEmail: 'other.client@fenwick-hale.test',
		room: {
			name: 'Basement cinema',
			lengthM: 7.4,
			widthM: 5.1,
			heightM: 2.45,
			roomUse: 'home-theatre' as const,
			notes: 'Concrete walls, suspended ceiling planned.'
		},
		sessions: [{ conditionLabel: 'untreated', measuredOn: '2026-11-02', notes: 'Bare concrete shell.' }],
		positions: [{ label: 'P1', sourceLabel: 'centre channel', micLabel: 'middle seat', source: { x: 0.5, y: 2.55, z: 1.0 }, mic: { x: 4.6, y: 2.55, z: 1.1 } }]
	}
];
