import type { ParamMatcher } from '@sveltejs/kit';

/** Lower-case kebab-case slugs, as guides and parts are stored. */
export const match: ParamMatcher = (param) =>
	/^[a-z0-9]+(?:-[a-z0-9]+)*$/.test(param) && param.length <= 140;
