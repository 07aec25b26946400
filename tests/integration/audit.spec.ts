import { beforeEach, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { AuditEvent, User, sequelize } from '../../src/lib/server/db';
import * as audit from '../../src/lib/server/services/audit';
import { resetDatabase } from '../support/db';

/* The audit trail's filters on the real MariaDB (the admin page's /admin/audit list). */
async function makeUser(email: string) {
	return User.create({
		email,
		name: email.split('@')[0] ?? email,
		role: 'editor',
		passwordHash: '$argon2id$v=19$fake-hash-for-tests'
	});
}

async function event(
	actorId: string | null,
	action: string,
	subjectType: string,
	subjectId: string,
	at: string
) {
	const entry = await sequelize.transaction((t) =>
		audit.record(
			{
				actorId,
				action,
				subjectType,
				subjectId,
				before: { hidden: false },
				after: { hidden: true }
			},
			t
		)
	);
	// Events are append-only in the app; the test back-dates its own rows to exercise the date filter.
	await sequelize.query('UPDATE audit_events SET created_at = :at WHERE id = :id', {
		type: QueryTypes.UPDATE,
		replacements: { at: new Date(at), id: entry.id }
	});
	return entry.id;
}

describe('audit list filters on the real MariaDB', () => {
	let ids: Record<string, number>;

	beforeEach(async () => {
		await resetDatabase();
		const ed = await makeUser('edna_1@example.test');
		const other = await makeUser('Oscar.Second@example.test');
		ids = {
			hidden: await event(ed.id, 'guide.hidden', 'guide', '7', '2026-12-01T09:00:00Z'),
			restored: await event(ed.id, 'guide.restored', 'guide', '7', '2026-12-02T23:59:59Z'),
			role: await event(other.id, 'user.role_changed', 'user', other.id, '2026-12-03T00:00:00Z'),
			system: await event(null, 'content_report.dismissed', 'guide', '8', '2026-12-04T12:00:00Z')
		};
	});

	const listed = async (filters: Partial<Parameters<typeof audit.list>[0]>) =>
		(await audit.list({ page: 1, perPage: 50, ...filters })).items.map((e) => e.id);

	it('lists newest first and filters by action and subject type', async () => {
		expect(await listed({})).toEqual([ids.system, ids.role, ids.restored, ids.hidden]);
		expect(await listed({ action: 'guide.hidden' })).toEqual([ids.hidden]);
		expect(await listed({ subjectType: 'guide' })).toEqual([ids.system, ids.restored, ids.hidden]);
		expect(await listed({ subjectType: 'user', action: 'guide.hidden' })).toEqual([]);
	});

	it('filters by part of the actor e-mail, case-insensitively, with wildcards taken literally', async () => {
		expect(await listed({ actorEmail: 'EDNA' })).toEqual([ids.restored, ids.hidden]);
		expect(await listed({ actorEmail: 'oscar.second@' })).toEqual([ids.role]);
		// "_" would match any character in LIKE; here it matches only an underscore.
		expect(await listed({ actorEmail: 'edna_' })).toEqual([ids.restored, ids.hidden]);
		expect(await listed({ actorEmail: 'ednax' })).toEqual([]);
		expect(await listed({ actorEmail: '%' })).toEqual([]);
		const page = await audit.list({ page: 1, perPage: 1, actorEmail: 'edna' });
		expect(page).toMatchObject({ total: 2, pageCount: 2 });
		expect(page.items[0]?.actor?.email).toBe('edna_1@example.test');
	});

	it('filters by a time window, start inclusive and end exclusive', async () => {
		const from = new Date('2026-12-02T00:00:00Z');
		const to = new Date('2026-12-03T00:00:00Z');
		expect(await listed({ from, to })).toEqual([ids.restored]);
		expect(await listed({ from: to })).toEqual([ids.system, ids.role]);
		expect(await listed({ to: from })).toEqual([ids.hidden]);
	});

	it('offers the actions and subject types in use for the filter lists', async () => {
		const choices = await audit.filterChoices();
		expect(choices.subjectTypes).toEqual(['guide', 'user']);
		expect(choices.actions).toEqual(
			expect.arrayContaining(['guide.hidden', 'guide.restored', 'user.enabled'])
		);
		expect(await AuditEvent.count()).toBe(4);
	});
});
