import { randomUUID } from 'node:crypto';
import { beforeEach, describe, expect, it } from 'vitest';
import { changeRoleInput, setDisabledInput, userSearchQuery } from '../../src/lib/schemas/users';
import { fieldIssues } from '../../src/lib/schemas/issues';
import { AuditEvent, User } from '../../src/lib/server/db';
import * as audit from '../../src/lib/server/services/audit';
import * as users from '../../src/lib/server/services/users';
import type { Role } from '../../src/lib/domain/types';
import { resetDatabase } from '../support/db';

/** Creates an account directly, `minutesAgo` old so "newest first" is deterministic. */
async function makeUser(email: string, name: string, role: Role = 'reader', minutesAgo = 0) {
	const createdAt = new Date(Date.UTC(2026, 10, 1, 12, 0, 0) - minutesAgo * 60_000);
	return User.create({
		email,
		name,
		role,
		passwordHash: '$argon2id$v=19$fake-hash-for-tests',
		createdAt
	});
}

async function reload(id: string) {
	const user = await User.findByPk(id);
	if (!user) throw new Error(`user ${id} vanished`);
	return user;
}

describe('users service on the real MariaDB', () => {
	beforeEach(async () => {
		await resetDatabase();
	});

	describe('search', () => {
		it('pages 25 at a time, newest first, with total and page count', async () => {
			for (let i = 0; i < 30; i++) {
				await makeUser(
					`member${String(i).padStart(2, '0')}@example.test`,
					`Member ${i}`,
					'reader',
					i
				);
			}
			const first = await users.search({ q: '', page: 1 });
			expect(first.total).toBe(30);
			expect(first.perPage).toBe(25);
			expect(first.pageCount).toBe(2);
			expect(first.items).toHaveLength(25);
			expect(first.items[0]?.email).toBe('member00@example.test');
			expect(first.items[24]?.email).toBe('member24@example.test');

			const second = await users.search({ q: '', page: 2 });
			expect(second.page).toBe(2);
			expect(second.items.map((u) => u.email)).toEqual(
				[25, 26, 27, 28, 29].map((i) => `member${i}@example.test`)
			);

			// Past the end: the last page, not an empty one.
			const beyond = await users.search({ q: '', page: 9 });
			expect(beyond.page).toBe(2);
			expect(beyond.items).toHaveLength(5);
		});

		it('finds by part of the name or the e-mail, case-insensitively, and filters by role', async () => {
			await makeUser('ana.quill@example.test', 'Ana Quill', 'author', 1);
			await makeUser('bo@quillworks.test', 'Bo Marsh', 'reader', 2);
			await makeUser('cy@example.test', 'Cy Dune', 'editor', 3);

			const byName = await users.search({ q: 'QUILL', page: 1 });
			expect(byName.items.map((u) => u.email)).toEqual([
				'ana.quill@example.test',
				'bo@quillworks.test'
			]);
			expect(byName.total).toBe(2);

			const readers = await users.search({ q: 'quill', role: 'reader', page: 1 });
			expect(readers.items.map((u) => u.email)).toEqual(['bo@quillworks.test']);

			const editors = await users.search({ q: '', role: 'editor', page: 1 });
			expect(editors.items.map((u) => u.name)).toEqual(['Cy Dune']);
		});

		it('takes % and _ in the search literally (escaped LIKE, no SQL built from the text)', async () => {
			await makeUser('quiet@example.test', '100% quiet', 'reader', 1);
			await makeUser('loud@example.test', '100 loud', 'reader', 2);
			await makeUser('under_score@example.test', 'Under Score', 'reader', 3);
			await makeUser('underxscore@example.test', 'Underx Score', 'reader', 4);

			expect((await users.search({ q: '%', page: 1 })).items.map((u) => u.email)).toEqual([
				'quiet@example.test'
			]);
			expect((await users.search({ q: 'under_', page: 1 })).items.map((u) => u.email)).toEqual([
				'under_score@example.test'
			]);
			// A classic injection string is just text that matches nobody, and no error.
			expect((await users.search({ q: "' OR 1=1 -- ", page: 1 })).total).toBe(0);
			expect((await users.search({ q: '\\', page: 1 })).total).toBe(0);
		});

		it('returns only the listed fields: never a password hash or session version', async () => {
			await makeUser('dee@example.test', 'Dee Vale');
			const [row] = (await users.search({ q: 'dee', page: 1 })).items;
			expect(Object.keys(row ?? {}).sort()).toEqual(
				['createdAt', 'disabledAt', 'email', 'id', 'name', 'role', 'state'].sort()
			);
			expect(JSON.stringify(row)).not.toContain('argon2');
			expect(row?.state).toBe('active');
		});
	});

	describe('changeRole', () => {
		it('changes the role without ending sessions (the role is re-read per request) and audits before/after', async () => {
			const admin = await makeUser('root@example.test', 'Ada Admin', 'admin');
			const reader = await makeUser('eve@example.test', 'Eve Reed', 'reader');

			const outcome = await users.changeRole(admin.id, reader.id, 'editor');
			expect(outcome).toMatchObject({ kind: 'ok', user: { id: reader.id, role: 'editor' } });

			const after = await reload(reader.id);
			expect(after.role).toBe('editor');
			expect(after.sessionVersion).toBe(reader.sessionVersion);

			const events = await AuditEvent.findAll({
				where: { subjectType: 'user', subjectId: reader.id }
			});
			expect(events).toHaveLength(1);
			expect(events[0]?.actorId).toBe(admin.id);
			expect(events[0]?.action).toBe('user.role_changed');
			expect(events[0]?.createdAt).toBeInstanceOf(Date);

			const listed = await audit.list({ page: 1, perPage: 10, action: 'user.role_changed' });
			expect(listed.total).toBe(1);
			expect(listed.items[0]).toMatchObject({
				actor: { id: admin.id, email: 'root@example.test' },
				subjectId: reader.id,
				before: { role: 'reader' },
				after: { role: 'editor' }
			});
		});

		it('refuses an admin demoting themselves, and a change to the same role, without writing', async () => {
			const admin = await makeUser('root@example.test', 'Ada Admin', 'admin');
			const author = await makeUser('fay@example.test', 'Fay Writer', 'author');

			const self = await users.changeRole(admin.id, admin.id, 'editor');
			expect(self).toMatchObject({ kind: 'conflict' });
			const same = await users.changeRole(admin.id, author.id, 'author');
			expect(same).toMatchObject({ kind: 'conflict', message: 'Fay Writer is already an author.' });

			expect((await reload(admin.id)).role).toBe('admin');
			expect((await reload(admin.id)).sessionVersion).toBe(1);
			expect((await reload(author.id)).sessionVersion).toBe(1);
			expect(await AuditEvent.count()).toBe(0);
		});

		it('answers not_found for an unknown account', async () => {
			const admin = await makeUser('root@example.test', 'Ada Admin', 'admin');
			expect(await users.changeRole(admin.id, randomUUID(), 'editor')).toEqual({
				kind: 'not_found'
			});
		});
	});

	describe('setDisabled', () => {
		it('disables and re-enables, bumping the session version and auditing each change', async () => {
			const admin = await makeUser('root@example.test', 'Ada Admin', 'admin');
			const member = await makeUser('gus@example.test', 'Gus Pike');

			const disabled = await users.setDisabled(admin.id, member.id, true);
			expect(disabled).toMatchObject({ kind: 'ok', user: { state: 'disabled' } });
			const whileDisabled = await reload(member.id);
			expect(whileDisabled.disabledAt).toBeInstanceOf(Date);
			expect(whileDisabled.sessionVersion).toBe(2);

			expect(await users.setDisabled(admin.id, member.id, true)).toEqual({
				kind: 'conflict',
				message: 'Gus Pike is already disabled.'
			});

			const enabled = await users.setDisabled(admin.id, member.id, false);
			expect(enabled).toMatchObject({ kind: 'ok', user: { state: 'active', disabledAt: null } });
			const afterEnable = await reload(member.id);
			expect(afterEnable.disabledAt).toBeNull();
			expect(afterEnable.sessionVersion).toBe(3);

			const trail = await audit.list({ page: 1, perPage: 10 });
			expect(trail.items.map((e) => e.action).sort()).toEqual(['user.disabled', 'user.enabled']);
			const disableEvent = trail.items.find((e) => e.action === 'user.disabled');
			expect(disableEvent?.before).toEqual({ disabledAt: null, sessionVersion: 1 });
			expect(disableEvent?.after).toEqual({
				disabledAt: whileDisabled.disabledAt?.toISOString(),
				sessionVersion: 2
			});
			expect((await users.search({ q: 'gus', page: 1 })).items[0]?.state).toBe('active');
		});

		it('refuses disabling yourself', async () => {
			const admin = await makeUser('root@example.test', 'Ada Admin', 'admin');
			expect(await users.setDisabled(admin.id, admin.id, true)).toMatchObject({ kind: 'conflict' });
			expect((await reload(admin.id)).disabledAt).toBeNull();
			expect(await AuditEvent.count()).toBe(0);
		});
	});

	describe('input schemas', () => {
		it('refuse extra fields and bad values with field-level messages', () => {
			const extra = changeRoleInput.safeParse({
				userId: randomUUID(),
				role: 'editor',
				sessionVersion: '9'
			});
			expect(extra.success).toBe(false);
			if (!extra.success) expect(Object.keys(fieldIssues(extra.error))).toEqual(['_form']);

			const badRole = changeRoleInput.safeParse({ userId: 'not-a-uuid', role: 'owner' });
			expect(badRole.success).toBe(false);
			if (!badRole.success)
				expect(Object.keys(fieldIssues(badRole.error)).sort()).toEqual(['role', 'userId']);

			expect(setDisabledInput.parse({ userId: randomUUID(), disabled: 'false' }).disabled).toBe(
				false
			);
			expect(userSearchQuery.parse({ q: '  ana ', role: '', page: '' })).toEqual({
				q: 'ana',
				page: 1
			});
			const badPage = userSearchQuery.safeParse({ page: '0' });
			expect(badPage.success).toBe(false);
			if (!badPage.success) expect(fieldIssues(badPage.error).page).toEqual(['Pages start at 1.']);
		});
	});
});
