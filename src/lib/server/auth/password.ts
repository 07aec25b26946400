/*
 * Password hashing with argon2id at the OWASP Password Storage Cheat Sheet minimum
 * (m = 19 MiB, t = 2, p = 1; docs/sources.md 13b). Relative imports only: the seeders use it.
 */
import { hash, verify } from '@node-rs/argon2';

export const ARGON2_OPTIONS = {
	// Algorithm.Argon2id; the package's const enum cannot be imported under verbatimModuleSyntax.
	algorithm: 2,
	memoryCost: 19_456, // KiB
	timeCost: 2,
	parallelism: 1
} as const;

export function hashPassword(password: string): Promise<string> {
	return hash(password, ARGON2_OPTIONS);
}

export async function verifyPassword(storedHash: string, password: string): Promise<boolean> {
	try {
		return await verify(storedHash, password);
	} catch {
		// A malformed stored hash is a failed check, never a crash of the sign-in route.
		return false;
	}
}
