// Form actions of the plan pages: run a change and answer with what was saved (so the page
// can say so), or with the refused change's status and reason beside the field it concerns.
import { z } from 'zod';
import { formAction } from '../forms';
import { invalid } from '../problem';

export function planChange<S extends z.ZodType, T extends string>(
	request: Request,
	schema: S | ((form: FormData) => S),
	saved: T,
	work: (input: z.infer<S>, form: FormData) => Promise<unknown>
) {
	return formAction(request, schema, async (input, form) => {
		await work(input, form);
		return { saved };
	});
}

/** The id a button sends with its form (the item or sheet to change or remove). */
export function idIn(form: FormData, name: string, message: string): number {
	const id = Number(form.get(name));
	if (!Number.isInteger(id) || id <= 0) throw invalid(message);
	return id;
}

/** A remove button: its form carries only the id of what it removes. */
export function planRemoval<T extends string>(request: Request, saved: T, idName: string, message: string, remove: (id: number) => Promise<unknown>) {
	return planChange(request, z.object({}), saved, (_, form) => remove(idIn(form, idName, message)));
}
