import type { Role } from '../../domain/types.js';

/** Who is asking, as the hook resolved it from the session and the database. */
export interface SessionUser {
	id: string;
	email: string;
	name: string | null;
	role: Role;
}
