import type { ParamMatcher } from '@sveltejs/kit';

/** A database id: a positive integer without sign, leading zeros or exponent. */
export const match: ParamMatcher = (param) =>
	/^[1-9][0-9]{0,9}$/.test(param) && Number(param) <= 4_294_967_295;
