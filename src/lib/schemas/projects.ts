import { z } from 'zod';
import { ROLES } from '../roles';
import { email } from './auth';
import { parseLength } from '../treatment/units';
import { formatRoomLength, type UnitSystem } from '../format/room';

export type { UnitSystem };

/** The unit system a form was shown in (its `units` field), else the user's own. */
export function formUnitSystem(form: FormData, fallback: UnitSystem): UnitSystem {
	const v = form.get('units');
	return v === 'metric' || v === 'imperial' ? v : fallback;
}

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

const BARE_NUMBER = /^\d+(?:[.,]\d*)?$|^[.,]\d+$/;

/**
 * A room-scale length typed in the form's unit system, in metres. Any unit may be written
 * ("5.2 m", "520 cm", "12' 6"", "12 ft 6 in", "150 in"); a bare number is metres, or feet in an
 * imperial form. Parsed by the one length parser (treatment/units.ts), converted here.
 */
function roomLength(label: string, system: UnitSystem): z.ZodType<number, string | number>;
function roomLength(label: string, system: UnitSystem, opts: { optional: true }): z.ZodType<number | null, string | number | undefined>;
function roomLength(label: string, system: UnitSystem, opts: { optional?: boolean } = {}): z.ZodType<unknown, unknown> {
	const bareUnit = system === 'imperial' ? 'ft' : 'm';
	return z.union([z.number(), z.string(), z.undefined()], { error: `Enter the ${label}.` }).transform((raw, ctx) => {
		const text = raw === undefined ? '' : String(raw).trim();
		if (text === '') {
			if (opts.optional) return null;
			ctx.addIssue({ code: 'custom', message: `Enter the ${label}.` });
			return z.NEVER;
		}
		if (/^[-−]/.test(text)) {
			ctx.addIssue({ code: 'custom', message: opts.optional ? `The ${label} cannot be negative.` : `The ${label} must be more than zero.` });
			return z.NEVER;
		}
		try {
			return parseLength(BARE_NUMBER.test(text) ? `${text} ${bareUnit}` : text) / 1000;
		} catch (e) {
			const message =
				system === 'imperial'
					? `${label[0].toUpperCase()}${label.slice(1)}: ${(e as Error).message}.`
					: `Enter the ${label} in metres (or with its unit, e.g. "520 cm").`;
			ctx.addIssue({ code: 'custom', message });
			return z.NEVER;
		}
	});
}

const dimension = (label: string, max: number, system: UnitSystem) =>
	roomLength(label, system)
		.refine((v) => v > 0, { error: `The ${label} must be more than zero.` })
		.refine((v) => v >= ROOM_LIMITS.minM, { error: `A ${label} under ${formatRoomLength(ROOM_LIMITS.minM, system)} is not a room.` })
		.refine((v) => v <= max, { error: `A ${label} over ${formatRoomLength(max, system)} looks like a typing error.` });

export const ROOM_USES = ['listening', 'control', 'home-theatre', 'rehearsal', 'speech', 'other'] as const;
export const ROOM_USE_LABELS: Record<(typeof ROOM_USES)[number], string> = {
	listening: 'Listening room',
	control: 'Control room',
	'home-theatre': 'Home theatre',
	rehearsal: 'Rehearsal room',
	speech: 'Speech / meeting room',
	other: 'Other'
};

/** The room form in its unit system (the form says which in its `units` field). */
export function roomSchemaFor(system: UnitSystem) {
	return z.object({
		name: text('a room name', 200),
		lengthM: dimension('length', ROOM_LIMITS.maxLengthM, system),
		widthM: dimension('width', ROOM_LIMITS.maxLengthM, system),
		heightM: dimension('height', ROOM_LIMITS.maxHeightM, system),
		roomUse: z.enum(ROOM_USES, { error: 'Pick what the room is used for.' }),
		notes: optionalText(5000)
	});
}

export const roomSchema = roomSchemaFor('metric');

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

/** A coordinate in the form's unit system, in metres; empty is none. The room check says where it must lie. */
const coordinate = (system: UnitSystem) =>
	roomLength('coordinate', system, { optional: true })
		.optional()
		.transform((v) => v ?? null);

/** The position form in its unit system (the form says which in its `units` field). */
export function positionSchemaFor(system: UnitSystem) {
	return z.object({
		label: text('a position label (e.g. "P1")', 80),
		sourceLabel: optionalText(80),
		micLabel: optionalText(80),
		sourceX: coordinate(system),
		sourceY: coordinate(system),
		sourceZ: coordinate(system),
		micX: coordinate(system),
		micY: coordinate(system),
		micZ: coordinate(system)
	});
}

export const positionSchema = positionSchemaFor('metric');

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
