import { describe, expect, it } from 'vitest';
import { PERMISSIONS, scopesAllow, TOKEN_SCOPES, type Permission, type TokenScope } from '../../src/lib/roles';
import { createTokenSchema, TOKEN_PATTERN } from '../../src/lib/schemas/api-tokens';
import { newApiToken } from '../../src/lib/server/api-tokens/service';
import { hashToken } from '../../src/lib/server/auth/tokens';

// What each scope of a personal API token opens. The table is the product's rule, written out
// here by hand so a change to the grants shows up as a failing row.
const OPENS: Record<TokenScope, Permission[]> = {
	read: ['project:read', 'project:internal'],
	upload: ['capture:write'],
	review: ['review:write', 'report:publish']
};

describe('scopesAllow', () => {
	it.each(TOKEN_SCOPES.flatMap((s) => PERMISSIONS.map((p) => [s, p] as const)))('%s → %s as in the table', (scope, permission) => {
		expect(scopesAllow([scope], permission)).toBe(OPENS[scope].includes(permission));
	});

	it('a token with several scopes may do what any one of them opens, and nothing else', () => {
		for (const p of PERMISSIONS) {
			expect(scopesAllow(['read', 'upload'], p)).toBe(OPENS.read.includes(p) || OPENS.upload.includes(p));
		}
	});

	it('no scope opens creating or editing projects, or managing people', () => {
		for (const p of ['project:create', 'project:edit', 'members:manage'] as const) expect(scopesAllow([...TOKEN_SCOPES], p)).toBe(false);
	});

	it('no scopes open nothing', () => {
		for (const p of PERMISSIONS) expect(scopesAllow([], p)).toBe(false);
	});
});

describe('createTokenSchema', () => {
	const form = (fields: Record<string, string>) => createTokenSchema.safeParse({ name: 'rig laptop', expiresInDays: '90', ...fields });

	it('reads ticked boxes as scopes, in a fixed order', () => {
		const r = form({ scope_upload: 'on', scope_read: 'on' });
		expect(r.success && r.data).toEqual({ name: 'rig laptop', expiresInDays: 90, scopes: ['read', 'upload'] });
	});

	it('refuses a token without scopes, beside the scopes', () => {
		const r = form({});
		expect(r.success).toBe(false);
		expect(r.error?.issues.map((i) => i.path.join('.'))).toEqual(['scopes']);
	});

	it.each([
		['0', false],
		['1', true],
		['365', true],
		['366', false],
		['30.5', false],
		['', false]
	])('expiry of %s days: accepted %s (one day to one year)', (days, ok) => {
		expect(form({ scope_read: 'on', expiresInDays: days }).success).toBe(ok);
	});

	it('refuses an empty or too long name', () => {
		expect(form({ scope_read: 'on', name: '   ' }).success).toBe(false);
		expect(form({ scope_read: 'on', name: 'x'.repeat(81) }).success).toBe(false);
		expect(form({ scope_read: 'on', name: 'x'.repeat(80) }).success).toBe(true);
	});
});

describe('newApiToken', () => {
	it('makes a prefixed 256-bit token, its SHA-256 and a short hint, different each time', () => {
		const a = newApiToken();
		const b = newApiToken();
		expect(a.token).toMatch(TOKEN_PATTERN);
		expect(a.token).not.toBe(b.token);
		expect(a.tokenHash).toBe(hashToken(a.token));
		expect(a.tokenHash).toMatch(/^[0-9a-f]{64}$/);
		expect(a.hint).toBe(a.token.slice(0, 8));
		// 43 base64url characters carry 258 bits, of which 256 are random.
		expect(Buffer.from(a.token.slice(4), 'base64url').byteLength).toBe(32);
	});
});
