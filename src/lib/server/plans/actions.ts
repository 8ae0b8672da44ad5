// Form actions of the plan pages: run a change and answer with what was saved, or with the
// refused change's status and reason beside the field it concerns.
import { problemToFailure } from '../forms';

export async function planChange<T extends string>(form: FormData, work: () => Promise<unknown>, saved: T) {
	try {
		await work();
		return { saved };
	} catch (e) {
		return problemToFailure(e, form);
	}
}
