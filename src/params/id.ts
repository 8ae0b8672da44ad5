import type { ParamMatcher } from '@sveltejs/kit';

// Database ids: positive integers without leading zeros, small enough for an INT column.
export const match = ((param: string): param is string =>
	/^[1-9]\d{0,9}$/.test(param) && Number(param) <= 2_147_483_647) satisfies ParamMatcher;
