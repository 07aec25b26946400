import { QueryTypes } from 'sequelize';
import { firstFreeHandle, handleBase } from '../../../domain/handles.js';
import type { Migration } from '../umzug.js';

/*
 * Data only: every account without a handle gets one from its name (domain/handles.ts),
 * numbered when taken, oldest accounts first so the first "Mira Falkenberg" keeps the plain
 * handle. Names only, never the e-mail address: a handle is public.
 */
export const up: Migration = async ({ context: qi }) => {
	const users = await qi.sequelize.query<{
		id: string;
		name: string | null;
		handle: string | null;
	}>('SELECT id, name, handle FROM users ORDER BY created_at, id', { type: QueryTypes.SELECT });
	const taken = new Set(users.flatMap((u) => (u.handle ? [u.handle.toLowerCase()] : [])));
	for (const user of users) {
		if (user.handle) continue;
		const handle = firstFreeHandle(handleBase(user.name), taken);
		taken.add(handle);
		await qi.sequelize.query('UPDATE users SET handle = ? WHERE id = ?', {
			replacements: [handle, user.id],
			type: QueryTypes.UPDATE
		});
	}
};

// Going back, the column is dropped by the migration before this one; nothing to undo here.
export const down: Migration = async () => {};
