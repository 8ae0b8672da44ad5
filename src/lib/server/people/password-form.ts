// The password form of a one-time link (an invitation, a reset): the token comes from the
// address, and the schema checks it together with the two passwords.
import type { z } from 'zod';
import { parseForm, problemToFailure } from '../forms';
import { setPasswordSchema } from '../../schemas/auth';

export async function passwordFormAction<R>(request: Request, token: string, work: (input: z.output<typeof setPasswordSchema>) => Promise<R>) {
	const form = await request.formData();
	form.set('token', token);
	const parsed = parseForm(setPasswordSchema, form);
	if (!parsed.ok) return parsed.failure;
	try {
		return await work(parsed.data);
	} catch (e) {
		return problemToFailure(e, form);
	}
}
