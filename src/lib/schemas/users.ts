import { z } from 'zod';
import { pageNumber } from './query-params';
import { ROLES } from '../domain/types.js';

/*
 * Inputs of the admin users page. Form and query values arrive as strings, so numbers
 * and booleans are parsed here; every schema is strict so a posted `sessionVersion` or
 * `passwordHash` is refused rather than silently ignored (mass assignment).
 */

/** Users listed per page on /admin/users. */
export const USERS_PER_PAGE = 25;

// A <select> with "All roles" posts an empty string: that means "no filter", not a bad role.
const emptyAsUndefined = (value: unknown) => (value === '' ? undefined : value);

const role = z.enum(ROLES, { error: 'Choose one of reader, author, editor or admin.' });

/** GET /admin/users?q=&role=&page= */
export const userSearchQuery = z.strictObject({
	q: z.string().trim().max(100, 'Search for at most 100 characters.').default(''),
	role: z.preprocess(emptyAsUndefined, role.optional()),
	page: pageNumber
});
export type UserSearchQuery = z.infer<typeof userSearchQuery>;

const userId = z.uuid({ error: 'Unknown account.' });

/** POST ?/changeRole */
export const changeRoleInput = z.strictObject({ userId, role });
export type ChangeRoleInput = z.infer<typeof changeRoleInput>;

/** POST ?/setDisabled — `disabled` is the state asked for: "true" disables, "false" enables. */
export const setDisabledInput = z.strictObject({
	userId,
	disabled: z
		.enum(['true', 'false'], { error: 'Choose disable or enable.' })
		.transform((value) => value === 'true')
});
export type SetDisabledInput = z.infer<typeof setDisabledInput>;
