/* Session and token fields Slotwise adds to Auth.js's types. */
import type { Role } from '../../domain/types.js';

declare module '@auth/core/types' {
	interface Session {
		user: { id: string; role: Role; email: string; name: string | null; image?: string | null };
	}
}

declare module '@auth/core/jwt' {
	interface JWT {
		uid?: string;
		/** The account's session version when the token was issued. */
		sv?: number;
		/** Unix seconds of the sign-in, for the absolute session lifetime. */
		authAt?: number;
		role?: Role;
	}
}

export {};
