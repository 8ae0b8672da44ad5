import { z } from 'zod';

export const email = z
	.string({ error: 'Enter an e-mail address.' })
	.trim()
	.toLowerCase()
	.pipe(z.email({ error: 'Enter a valid e-mail address.' }).max(254, { error: 'That address is too long.' }));

export const signInSchema = z.object({
	email,
	password: z.string({ error: 'Enter your password.' }).min(1, { error: 'Enter your password.' }).max(200)
});

// Length over composition rules (NIST SP 800-63B §5.1.1.2).
export const newPassword = z
	.string({ error: 'Choose a password.' })
	.min(10, { error: 'Use at least 10 characters.' })
	.max(200, { error: 'Use at most 200 characters.' });

export const setPasswordSchema = z
	.object({
		token: z.string().min(20).max(200),
		name: z.string().trim().min(1, { error: 'Enter your name.' }).max(200).optional(),
		password: newPassword,
		confirm: z.string()
	})
	.refine((v) => v.password === v.confirm, { path: ['confirm'], error: 'The two passwords differ.' });

export const forgotPasswordSchema = z.object({ email });
