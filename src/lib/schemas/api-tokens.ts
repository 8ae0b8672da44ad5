import { z } from 'zod';
import { TOKEN_SCOPES, type TokenScope } from '../roles';

/** The longest a token may live, and the choices the account page offers (days). */
export const TOKEN_MAX_DAYS = 365;
export const TOKEN_EXPIRY_CHOICES = [7, 30, 90, 365] as const;
export const TOKEN_DEFAULT_DAYS = 90;

/**
 * The account page's form: a name, one checkbox per scope (`scope_read`, `scope_upload`,
 * `scope_review`: a form sends a ticked box as "on" and leaves an unticked one out) and the days
 * until it expires.
 */
export const createTokenSchema = z
	.object({
		name: z.string({ error: 'Name the token.' }).trim().min(1, { error: 'Name the token, e.g. after the script or machine that uses it.' }).max(80, { error: 'At most 80 characters.' }),
		expiresInDays: z.coerce
			.number({ error: 'Pick when the token expires.' })
			.int({ error: 'Pick when the token expires.' })
			.min(1, { error: 'A token lasts at least one day.' })
			.max(TOKEN_MAX_DAYS, { error: `A token lasts at most ${TOKEN_MAX_DAYS} days.` }),
		scope_read: z.literal('on').optional(),
		scope_upload: z.literal('on').optional(),
		scope_review: z.literal('on').optional()
	})
	.transform((v) => ({
		name: v.name,
		expiresInDays: v.expiresInDays,
		scopes: TOKEN_SCOPES.filter((s) => v[`scope_${s}`] === 'on') as TokenScope[]
	}))
	.refine((v) => v.scopes.length > 0, { path: ['scopes'], error: 'Tick at least one scope.' });
export type CreateTokenInput = z.infer<typeof createTokenSchema>;

export const revokeTokenSchema = z.object({ tokenId: z.coerce.number({ error: 'Pick a token.' }).int().positive({ error: 'Pick a token.' }) });

/** The shape of a token as sent: the prefix and 32 random bytes in base64url. */
export const TOKEN_PATTERN = /^rdt_[A-Za-z0-9_-]{43}$/;
