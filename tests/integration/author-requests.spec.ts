import { randomUUID } from 'node:crypto';
import { createServer } from 'node:net';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import type { Role } from '../../src/lib/domain/types';
import {
	authorRequestInput,
	decideAuthorRequestInput
} from '../../src/lib/schemas/author-requests';
import { fieldIssues } from '../../src/lib/schemas/issues';
import { AuditEvent, AuthorRequest, User } from '../../src/lib/server/db';
import { closeTransport } from '../../src/lib/server/mail';
import * as authorRequests from '../../src/lib/server/services/author-requests';
import { resetDatabase } from '../support/db';
import { waitForMessage } from '../support/mailbox';

const PITCH = 'I build quiet small-form-factor machines and would like to write guides about them.';

async function makeUser(email: string, name: string, role: Role = 'reader') {
	return User.create({ email, name, role });
}

async function reload(id: string) {
	const user = await User.findByPk(id);
	if (!user) throw new Error(`user ${id} vanished`);
	return user;
}

/**
 * A recipient no earlier run has used: the SMTP fake's mailbox is shared and not cleared
 * here (other suites may be reading it), so a fixed address could match an old message.
 */
function freshAddress(local: string): string {
	return `${local}-${randomUUID().slice(0, 8)}@example.test`;
}

// The SMTP fake runs under `npm test` (and `bash scripts/smtp-fake.sh start`), which sets MAILBOX_URL.
const withMailbox = Boolean(process.env.MAILBOX_URL);

/** A loopback port with nothing listening: connecting to it is refused at once. */
async function closedPort(): Promise<number> {
	const server = createServer();
	await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
	const address = server.address();
	await new Promise<void>((resolve) => server.close(() => resolve()));
	if (!address || typeof address === 'string') throw new Error('no port');
	return address.port;
}

describe('author requests on the real MariaDB', () => {
	beforeEach(async () => {
		await resetDatabase();
	});

	describe('submit', () => {
		it('files one pending request and refuses a second while it waits', async () => {
			const reader = await makeUser('hal@example.test', 'Hal Brook');
			const first = await authorRequests.submit(reader.id, PITCH);
			expect(first).toMatchObject({
				kind: 'ok',
				request: { state: 'pending', pitch: PITCH, decisionNote: null }
			});

			const second = await authorRequests.submit(reader.id, `${PITCH} Again.`);
			expect(second).toMatchObject({ kind: 'conflict' });
			expect(await AuthorRequest.count({ where: { userId: reader.id } })).toBe(1);

			expect(await authorRequests.getMine(reader.id)).toMatchObject({
				state: 'pending',
				pitch: PITCH
			});
		});

		it('lets only one of several simultaneous submits through (user row lock)', async () => {
			for (let round = 0; round < 5; round++) {
				const reader = await makeUser(`ivy${round}@example.test`, 'Ivy Stone');
				const outcomes = await Promise.all(
					[1, 2, 3, 4].map(() => authorRequests.submit(reader.id, PITCH))
				);
				expect(outcomes.filter((o) => o.kind === 'ok')).toHaveLength(1);
				expect(outcomes.filter((o) => o.kind === 'conflict')).toHaveLength(3);
				expect(await AuthorRequest.count({ where: { userId: reader.id, state: 'pending' } })).toBe(
					1
				);
			}
		});

		it('refuses accounts that are not readers, and unknown accounts', async () => {
			const author = await makeUser('jo@example.test', 'Jo Ink', 'author');
			expect(await authorRequests.submit(author.id, PITCH)).toEqual({
				kind: 'conflict',
				message: 'Your account already has the author role.'
			});
			expect(await authorRequests.submit('00000000-0000-4000-8000-000000000000', PITCH)).toEqual({
				kind: 'not_found'
			});
			expect(await AuthorRequest.count()).toBe(0);
			expect(await authorRequests.getMine(author.id)).toBeNull();
		});
	});

	it('lists pending requests oldest first with requester and whole days waiting', async () => {
		const older = await makeUser('kit@example.test', 'Kit Vale');
		const newer = await makeUser('lu@example.test', 'Lu Fern');
		await authorRequests.submit(newer.id, PITCH);
		await authorRequests.submit(older.id, PITCH);
		await AuthorRequest.update(
			{ createdAt: new Date('2026-11-20T08:00:00Z') },
			{ where: { userId: older.id } }
		);
		await AuthorRequest.update(
			{ createdAt: new Date('2026-11-29T08:00:00Z') },
			{ where: { userId: newer.id } }
		);

		const page = await authorRequests.listPending({
			page: 1,
			now: new Date('2026-11-30T07:00:00Z')
		});
		expect(page.total).toBe(2);
		expect(page.items.map((r) => r.requester.email)).toEqual([
			'kit@example.test',
			'lu@example.test'
		]);
		// 9 days 23 hours → 9 whole days; 23 hours → 0.
		expect(page.items.map((r) => r.waitingDays)).toEqual([9, 0]);
		expect(page.items[0]?.requester).toEqual({
			id: older.id,
			name: 'Kit Vale',
			email: 'kit@example.test',
			role: 'reader'
		});
	});

	describe('decide', () => {
		afterEach(() => {
			// Tests below point the mailer elsewhere; the next send re-reads the environment.
			closeTransport();
		});

		it('approves: request approved, reader becomes author, session version bumped, both audited', async () => {
			const editor = await makeUser('mo@example.test', 'Mo Editor', 'editor');
			const reader = await makeUser(freshAddress('ned'), 'Ned Forge');
			const submitted = await authorRequests.submit(reader.id, PITCH);
			if (submitted.kind !== 'ok') throw new Error('submit failed');

			const outcome = await authorRequests.decide(editor.id, submitted.request.id, {
				approve: true,
				note: 'Welcome aboard.'
			});
			expect(outcome).toMatchObject({
				kind: 'ok',
				request: { state: 'approved', decisionNote: 'Welcome aboard.' }
			});
			if (process.env.MAILBOX_URL && outcome.kind === 'ok') expect(outcome.mailed).toBe(true);

			const after = await reload(reader.id);
			expect(after.role).toBe('author');
			expect(after.sessionVersion).toBe(reader.sessionVersion);

			const stored = await AuthorRequest.findByPk(submitted.request.id);
			expect(stored?.decidedById).toBe(editor.id);
			expect(stored?.decidedAt).toBeInstanceOf(Date);

			const events = await AuditEvent.findAll({ order: [['id', 'ASC']] });
			expect(events.map((e) => [e.action, e.subjectType, e.subjectId, e.actorId])).toEqual([
				['user.role_changed', 'user', reader.id, editor.id],
				['author_request.approved', 'author_request', String(submitted.request.id), editor.id]
			]);
			expect(events[0]?.before).toEqual({ role: 'reader' });
			expect(events[0]?.after).toEqual({ role: 'author' });
			expect(events[1]?.before).toEqual({ state: 'pending' });
			expect(events[1]?.after).toEqual({
				state: 'approved',
				decisionNote: 'Welcome aboard.',
				requesterRole: 'author'
			});

			expect(await authorRequests.getMine(reader.id)).toMatchObject({ state: 'approved' });
			expect((await authorRequests.listPending({ page: 1 })).total).toBe(0);

			if (withMailbox) {
				// Sent over real SMTP to the local fake, after the commit, to the requester only.
				const message = await waitForMessage({ to: reader.email, subject: /approved/ });
				expect(message.to).toEqual([reader.email]);
				expect(message.subject).toBe('Your Slotwise author request was approved');
				expect(message.text).toContain('Hello Ned Forge,');
				expect(message.text).toContain('Welcome aboard.');
			}
		});

		it('declines with a note and leaves the role alone; a decline without a note is refused', async () => {
			const editor = await makeUser('mo@example.test', 'Mo Editor', 'editor');
			const reader = await makeUser(freshAddress('oli'), 'Oli Marsh');
			const submitted = await authorRequests.submit(reader.id, PITCH);
			if (submitted.kind !== 'ok') throw new Error('submit failed');

			expect(
				await authorRequests.decide(editor.id, submitted.request.id, { approve: false, note: '  ' })
			).toMatchObject({ kind: 'conflict' });
			expect((await AuthorRequest.findByPk(submitted.request.id))?.state).toBe('pending');

			const outcome = await authorRequests.decide(editor.id, submitted.request.id, {
				approve: false,
				note: 'Please publish a build log on your profile first.'
			});
			expect(outcome).toMatchObject({ kind: 'ok', request: { state: 'declined' } });
			expect((await reload(reader.id)).role).toBe('reader');
			expect((await reload(reader.id)).sessionVersion).toBe(1);
			expect((await AuditEvent.findAll()).map((e) => e.action)).toEqual([
				'author_request.declined'
			]);
			if (withMailbox) {
				const message = await waitForMessage({ to: reader.email, subject: /author request/ });
				expect(message.subject).toBe('About your Slotwise author request');
				expect(message.text).toContain('Please publish a build log on your profile first.');
			}

			// Declined: the reader may ask again.
			expect(await authorRequests.submit(reader.id, PITCH)).toMatchObject({ kind: 'ok' });
		});

		it('refuses deciding twice, and answers not_found for an unknown request', async () => {
			const editor = await makeUser('mo@example.test', 'Mo Editor', 'editor');
			const reader = await makeUser('pia@example.test', 'Pia Lane');
			const submitted = await authorRequests.submit(reader.id, PITCH);
			if (submitted.kind !== 'ok') throw new Error('submit failed');

			await authorRequests.decide(editor.id, submitted.request.id, { approve: true, note: null });
			const again = await authorRequests.decide(editor.id, submitted.request.id, {
				approve: false,
				note: 'Changed my mind.'
			});
			expect(again).toEqual({ kind: 'conflict', message: 'This request was already approved.' });
			expect((await reload(reader.id)).role).toBe('author');
			expect(await AuditEvent.count({ where: { subjectType: 'author_request' } })).toBe(1);

			expect(
				await authorRequests.decide(editor.id, 999_999, { approve: true, note: null })
			).toEqual({
				kind: 'not_found'
			});
		});

		it('serves two editors deciding at once one after the other: exactly one wins', async () => {
			const first = await makeUser('mo@example.test', 'Mo Editor', 'editor');
			const second = await makeUser('ray@example.test', 'Ray Admin', 'admin');
			for (let round = 0; round < 5; round++) {
				const reader = await makeUser(`reader${round}@example.test`, `Reader ${round}`);
				const submitted = await authorRequests.submit(reader.id, PITCH);
				if (submitted.kind !== 'ok') throw new Error('submit failed');

				const outcomes = await Promise.all([
					authorRequests.decide(first.id, submitted.request.id, { approve: true, note: null }),
					authorRequests.decide(second.id, submitted.request.id, {
						approve: false,
						note: 'Not yet.'
					})
				]);
				const winners = outcomes.filter((o) => o.kind === 'ok');
				const losers = outcomes.filter((o) => o.kind === 'conflict');
				expect(winners).toHaveLength(1);
				expect(losers).toHaveLength(1);

				const stored = await AuthorRequest.findByPk(submitted.request.id);
				const approved = winners[0]?.kind === 'ok' && winners[0].request.state === 'approved';
				expect(stored?.state).toBe(approved ? 'approved' : 'declined');
				expect((await reload(reader.id)).role).toBe(approved ? 'author' : 'reader');
				expect(
					await AuditEvent.count({
						where: { subjectType: 'author_request', subjectId: String(submitted.request.id) }
					})
				).toBe(1);
			}
		});

		it('keeps the decision when the mail server cannot be reached, and says so', async () => {
			const editor = await makeUser('mo@example.test', 'Mo Editor', 'editor');
			const reader = await makeUser('sam@example.test', 'Sam Reed');
			const submitted = await authorRequests.submit(reader.id, PITCH);
			if (submitted.kind !== 'ok') throw new Error('submit failed');

			const savedPort = process.env.SMTP_PORT;
			const savedHost = process.env.SMTP_HOST;
			process.env.SMTP_HOST = '127.0.0.1';
			process.env.SMTP_PORT = String(await closedPort());
			closeTransport();
			try {
				const outcome = await authorRequests.decide(editor.id, submitted.request.id, {
					approve: true,
					note: null
				});
				expect(outcome).toMatchObject({
					kind: 'ok',
					mailed: false,
					request: { state: 'approved' }
				});
			} finally {
				if (savedPort === undefined) delete process.env.SMTP_PORT;
				else process.env.SMTP_PORT = savedPort;
				if (savedHost === undefined) delete process.env.SMTP_HOST;
				else process.env.SMTP_HOST = savedHost;
			}
			expect((await reload(reader.id)).role).toBe('author');
		});
	});

	describe('input schemas', () => {
		it('trims the pitch, counts CRLF as one character and bounds it to 20–1000', () => {
			expect(authorRequestInput.parse({ pitch: `  ${PITCH}\r\n` }).pitch).toBe(PITCH);
			const short = authorRequestInput.safeParse({ pitch: '   too short     ' });
			expect(short.success).toBe(false);
			if (!short.success) expect(Object.keys(fieldIssues(short.error))).toEqual(['pitch']);
			expect(authorRequestInput.safeParse({ pitch: 'x'.repeat(1000) }).success).toBe(true);
			expect(authorRequestInput.safeParse({ pitch: 'x'.repeat(1001) }).success).toBe(false);
			// 500 CRLF pairs are 1000 characters in the browser's count, and here.
			expect(authorRequestInput.safeParse({ pitch: `a${'\r\nb'.repeat(499)}b` }).success).toBe(
				true
			);
			expect(authorRequestInput.safeParse({ pitch: PITCH, role: 'author' }).success).toBe(false);
		});

		it('requires a note to decline, not to approve', () => {
			const decline = decideAuthorRequestInput.safeParse({
				requestId: '4',
				decision: 'decline',
				note: ' '
			});
			expect(decline.success).toBe(false);
			if (!decline.success) expect(Object.keys(fieldIssues(decline.error))).toEqual(['note']);
			expect(
				decideAuthorRequestInput.parse({ requestId: '4', decision: 'approve', note: '' })
			).toEqual({
				requestId: 4,
				approve: true,
				note: null
			});
			expect(
				decideAuthorRequestInput.safeParse({ requestId: 'x', decision: 'approve' }).success
			).toBe(false);
		});
	});
});
