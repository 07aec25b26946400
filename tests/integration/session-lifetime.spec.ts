import type { JWT } from '@auth/core/jwt';
import { beforeEach, describe, expect, it } from 'vitest';
import { User } from '../../src/lib/server/db';
import { SESSION_ABSOLUTE_SECONDS, authConfig } from '../../src/lib/server/auth/config';
import { resetDatabase } from '../support/db';

/*
 * ASVS 7.3.1/7.3.2 (docs/security.md §1): sessions end after an absolute lifetime however
 * active they are, and a role change, disable or session-version bump applies on the next
 * session read. Runs the real jwt callback against the real database.
 */
type JwtCallback = (params: { token: JWT; user?: unknown }) => Promise<JWT | null>;
const jwt = authConfig.callbacks?.jwt as unknown as JwtCallback;
const now = () => Math.floor(Date.now() / 1000);

describe('session checks in the jwt callback', () => {
	let user: User;
	beforeEach(async () => {
		await resetDatabase();
		user = await User.create({
			email: 'session@example.test',
			name: 'Sess',
			role: 'reader',
			emailVerified: new Date()
		});
	});

	it('keeps a fresh session and carries the current role from the database', async () => {
		const token = await jwt({ token: { uid: user.id, sv: 1, authAt: now() } });
		expect(token?.role).toBe('reader');
		await user.update({ role: 'author' });
		expect((await jwt({ token: { uid: user.id, sv: 1, authAt: now() } }))?.role).toBe('author');
	});

	it(`ends a session older than the absolute lifetime (${SESSION_ABSOLUTE_SECONDS / 86400} days)`, async () => {
		const old = now() - SESSION_ABSOLUTE_SECONDS - 60;
		expect(await jwt({ token: { uid: user.id, sv: 1, authAt: old } })).toBeNull();
		const justInside = now() - SESSION_ABSOLUTE_SECONDS + 60;
		expect(await jwt({ token: { uid: user.id, sv: 1, authAt: justInside } })).not.toBeNull();
	});

	it('ends a session whose version is behind the account, or whose account is disabled or gone', async () => {
		await user.update({ sessionVersion: 2 });
		expect(await jwt({ token: { uid: user.id, sv: 1, authAt: now() } })).toBeNull();
		expect(await jwt({ token: { uid: user.id, sv: 2, authAt: now() } })).not.toBeNull();
		await user.update({ disabledAt: new Date() });
		expect(await jwt({ token: { uid: user.id, sv: 2, authAt: now() } })).toBeNull();
		await user.destroy();
		expect(await jwt({ token: { uid: user.id, sv: 2, authAt: now() } })).toBeNull();
	});

	it('stamps a new sign-in with the account id, session version and time', async () => {
		const token = await jwt({ token: {}, user: { id: user.id, sessionVersion: 1 } });
		expect(token).toMatchObject({ uid: user.id, sv: 1, role: 'reader' });
		expect(Math.abs((token?.authAt ?? 0) - now())).toBeLessThan(5);
	});
});
