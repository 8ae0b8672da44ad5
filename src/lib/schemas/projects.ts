import { z } from 'zod';
import { ROLES } from '../roles';
import { email } from './auth';

const text = (label: string, max: number) =>
	z
		.string({ error: `Enter ${label}.` })
		.trim()
		.min(1, { error: `Enter ${label}.` })
		.max(max, { error: `Keep ${label} under ${max} characters.` });

const optionalText = (max: number) =>
	z
		.string()
		.trim()
		.max(max, { error: `Keep it under ${max} characters.` })
		.optional()
		.transform((v) => (v ? v : null));

export const projectSchema = z.object({
	organizationId: z.coerce.number().int().positive(),
	name: text('a project name', 200),
	clientName: text("the client's name", 200),
	description: optionalText(5000)
});

// Dimensions in metres. Below 0.5 m it is not a room; above these limits it is a typing error
// (the largest halls are ~100 m long and ~40 m high). Common practice, no source.
export const ROOM_LIMITS = { minM: 0.5, maxLengthM: 150, maxHeightM: 40 } as const;

const dimension = (label: string, max: number) =>
	z.coerce
		.number({ error: `Enter the ${label} in metres.` })
		.refine(Number.isFinite, { error: `Enter the ${label} in metres.` })
		.refine((v) => v > 0, { error: `The ${label} must be more than zero.` })
		.refine((v) => v >= ROOM_LIMITS.minM, { error: `A ${label} under ${ROOM_LIMITS.minM} m is not a room.` })
		.refine((v) => v <= max, { error: `A ${label} over ${max} m looks like a typing error.` });

export const ROOM_USES = ['listening', 'control', 'home-theatre', 'rehearsal', 'speech', 'other'] as const;
export const ROOM_USE_LABELS: Record<(typeof ROOM_USES)[number], string> = {
	listening: 'Listening room',
	control: 'Control room',
	'home-theatre': 'Home theatre',
	rehearsal: 'Rehearsal room',
	speech: 'Speech / meeting room',
	other: 'Other'
};

export const roomSchema = z.object({
	name: text('a room name', 200),
	lengthM: dimension('length', ROOM_LIMITS.maxLengthM),
	widthM: dimension('width', ROOM_LIMITS.maxLengthM),
	heightM: dimension('height', ROOM_LIMITS.maxHeightM),
	roomUse: z.enum(ROOM_USES, { error: 'Pick what the room is used for.' }),
	notes: optionalText(5000)
});

/** Volume of a rectangular room, m³. */
export function roomVolume(d: { lengthM: number; widthM: number; heightM: number }): number {
	return d.lengthM * d.widthM * d.heightM;
}

const isoDate = z
	.string({ error: 'Enter the date of the visit.' })
	.regex(/^\d{4}-\d{2}-\d{2}$/, { error: 'Use the form YYYY-MM-DD.' })
	.refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)), { error: 'That date does not exist.' });

export const sessionSchema = z.object({
	conditionLabel: text('the condition (e.g. "untreated")', 120),
	measuredOn: isoDate,
	notes: optionalText(5000)
});

const coordinate = z
	.union([z.literal(''), z.coerce.number().refine(Number.isFinite, { error: 'Enter a number in metres.' })])
	.optional()
	.transform((v) => (v === '' || v === undefined ? null : v));

export const positionSchema = z.object({
	label: text('a position label (e.g. "P1")', 80),
	sourceLabel: optionalText(80),
	micLabel: optionalText(80),
	sourceX: coordinate,
	sourceY: coordinate,
	sourceZ: coordinate,
	micX: coordinate,
	micY: coordinate,
	micZ: coordinate
});

export const invitationSchema = z
	.object({
		email,
		role: z.enum(ROLES, { error: 'Pick a role.' }),
		projectId: z
			.union([z.literal(''), z.coerce.number().int().positive()])
			.optional()
			.transform((v) => (v === '' || v === undefined ? null : v))
	})
	.refine((v) => v.role !== 'client' || v.projectId !== null, {
		path: ['projectId'],
		error: 'A client needs a project to see.'
	});

export const roleChangeSchema = z.object({
	userId: z.coerce.number().int().positive(),
	role: z.enum(ROLES, { error: 'Pick a role.' })
});

export const memberRemovalSchema = z.object({ userId: z.coerce.number().int().positive() });

export const projectMemberSchema = z.object({ email });
