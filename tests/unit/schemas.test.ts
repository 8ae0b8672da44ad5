import { describe, expect, it } from 'vitest';
import { invitationSchema, positionSchema, roomSchema, roomVolume, sessionSchema } from '../../src/lib/schemas/projects';
import { setPasswordSchema, signInSchema } from '../../src/lib/schemas/auth';

const room = { name: 'Studio A', lengthM: '6.2', widthM: '4.35', heightM: '2.7', roomUse: 'listening' };

describe('room schema', () => {
	it('accepts a plausible room and coerces the numbers', () => {
		const r = roomSchema.parse(room);
		expect(r).toMatchObject({ lengthM: 6.2, widthM: 4.35, heightM: 2.7, notes: null });
	});

	it.each([
		['lengthM', '0', 'more than zero'],
		['lengthM', '-3', 'more than zero'],
		['widthM', '0.2', 'not a room'],
		['heightM', '55', 'typing error'],
		['lengthM', '400', 'typing error'],
		['lengthM', 'abc', 'metres'],
		['lengthM', 'Infinity', 'metres']
	])('refuses %s = %s with a reason', (field, value, reason) => {
		const r = roomSchema.safeParse({ ...room, [field]: value });
		expect(r.success).toBe(false);
		const issue = r.error!.issues.find((i) => i.path[0] === field);
		expect(issue?.message).toContain(reason);
	});

	it('refuses an unknown use and an empty name', () => {
		expect(roomSchema.safeParse({ ...room, roomUse: 'ballroom' }).success).toBe(false);
		expect(roomSchema.safeParse({ ...room, name: '   ' }).success).toBe(false);
	});
});

describe('room volume', () => {
	// Volume of a rectangular box, V = L·W·H; 6.2 × 4.35 × 2.7 = 72.819 m³ (arithmetic).
	it.each([
		[{ lengthM: 6.2, widthM: 4.35, heightM: 2.7 }, 72.819],
		[{ lengthM: 5, widthM: 4, heightM: 3 }, 60],
		[{ lengthM: 1, widthM: 1, heightM: 1 }, 1]
	])('%o → %f m³', (d, v) => {
		expect(roomVolume(d)).toBeCloseTo(v, 9); // exact decimal arithmetic, 1e-9 for float rounding
	});
});

describe('session and position schemas', () => {
	it('accepts a real date and refuses an impossible one', () => {
		expect(sessionSchema.safeParse({ conditionLabel: 'untreated', measuredOn: '2026-11-17' }).success).toBe(true);
		expect(sessionSchema.safeParse({ conditionLabel: 'untreated', measuredOn: '17/11/2026' }).success).toBe(false);
		expect(sessionSchema.safeParse({ conditionLabel: '', measuredOn: '2026-11-17' }).success).toBe(false);
	});

	it('treats empty coordinates as absent and refuses text', () => {
		const p = positionSchema.parse({ label: 'P1', sourceX: '', micX: '1.5' });
		expect(p.sourceX).toBeNull();
		expect(p.micX).toBe(1.5);
		expect(positionSchema.safeParse({ label: 'P1', micY: 'left' }).success).toBe(false);
	});
});

describe('auth schemas', () => {
	it('normalises the e-mail and refuses a bad one', () => {
		expect(signInSchema.parse({ email: '  Client@Example.TEST ', password: 'x' }).email).toBe('client@example.test');
		expect(signInSchema.safeParse({ email: 'not-an-address', password: 'x' }).success).toBe(false);
		expect(signInSchema.safeParse({ email: 'a@b.test', password: '' }).success).toBe(false);
	});

	it('wants a long enough password typed twice alike', () => {
		const token = 'x'.repeat(43);
		expect(setPasswordSchema.safeParse({ token, password: 'short', confirm: 'short' }).success).toBe(false);
		const differ = setPasswordSchema.safeParse({ token, password: 'long enough pw', confirm: 'long enough pX' });
		expect(differ.error?.issues[0].path).toEqual(['confirm']);
		expect(setPasswordSchema.safeParse({ token, password: 'long enough pw', confirm: 'long enough pw' }).success).toBe(true);
	});

	it('requires a project for a client invitation only', () => {
		expect(invitationSchema.safeParse({ email: 'a@b.test', role: 'client', projectId: '' }).success).toBe(false);
		expect(invitationSchema.safeParse({ email: 'a@b.test', role: 'client', projectId: '4' }).success).toBe(true);
		expect(invitationSchema.safeParse({ email: 'a@b.test', role: 'consultant', projectId: '' }).success).toBe(true);
		expect(invitationSchema.safeParse({ email: 'a@b.test', role: 'owner' }).success).toBe(false);
	});
});
