import { beforeEach, describe, expect, it } from 'vitest';
import { TipSettings, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import * as authors from '../../src/lib/server/services/authors';
import { demoGuide, forkBuild, newReader } from '../support/buildsync-fixtures';
import { resetDatabase } from '../support/db';

/* Author pages, handles and following on the real MariaDB with the demo community seeded. */

let reader: User;

beforeEach(async () => {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	reader = (await User.findOne({ where: { email: 'reader@slotwise.test' } }))!;
});

describe('author pages', () => {
	it('every account gets a handle from its name, numbered when it is taken', async () => {
		const twin = await User.create({
			email: 'twin@example.test',
			name: 'Mira Falkenberg',
			role: 'reader'
		});
		expect(twin.handle).toBe('mira-falkenberg-2');
		const nameless = await User.create({
			email: 'nameless@example.test',
			name: null,
			role: 'reader'
		});
		expect(nameless.handle).toBe('member');
	});

	it('shows name, published guides, forks counted over every build, and followers', async () => {
		const page = (await authors.authorPage('priya-lindqvist', null))!;
		expect(page.name).toBe('Priya Lindqvist');
		expect(page.guides.map((g) => g.slug)).toEqual(['steady-1080p-starter']);
		expect(page.forks).toBe(0);
		expect(page.following).toBeNull();
		await forkBuild(await newReader('fork-a'), await demoGuide());
		await forkBuild(await newReader('fork-b'), await demoGuide());
		expect((await authors.authorPage('priya-lindqvist', null))!.forks).toBe(2);
	});

	it('offers tips (issue 20) only while the author takes them and payments are configured', async () => {
		const saved = {
			key: process.env.STRIPE_SECRET_KEY,
			secret: process.env.STRIPE_WEBHOOK_SECRET
		};
		try {
			process.env.STRIPE_SECRET_KEY = 'sk_test_for_the_author_page';
			process.env.STRIPE_WEBHOOK_SECRET = 'whsec_for_the_author_page';
			expect((await authors.authorPage('priya-lindqvist', null))!.tipsOpen).toBe(true);
			const priya = (await User.findOne({ where: { handle: 'priya-lindqvist' } }))!;
			await TipSettings.upsert({ userId: priya.id, tipsEnabled: false, thankYouMessage: '' });
			expect((await authors.authorPage('priya-lindqvist', null))!.tipsOpen).toBe(false);
			await TipSettings.upsert({ userId: priya.id, tipsEnabled: true, thankYouMessage: '' });
			delete process.env.STRIPE_SECRET_KEY;
			expect((await authors.authorPage('priya-lindqvist', null))!.tipsOpen).toBe(false);
		} finally {
			for (const [name, value] of [
				['STRIPE_SECRET_KEY', saved.key],
				['STRIPE_WEBHOOK_SECRET', saved.secret]
			] as const)
				if (value === undefined) delete process.env[name];
				else process.env[name] = value;
		}
	});

	it('a reader without published guides, an unknown handle and a disabled author have no page', async () => {
		expect(await authors.authorPage(reader.handle, null)).toBeNull();
		expect(await authors.authorPage('nobody-here', null)).toBeNull();
		await User.update({ disabledAt: new Date() }, { where: { handle: 'aiko-tanabe' } });
		expect(await authors.authorPage('aiko-tanabe', null)).toBeNull();
	});

	it('a reader follows and unfollows; following twice counts once; nobody follows themselves', async () => {
		expect(await authors.follow(reader.id, 'priya-lindqvist')).toEqual({ kind: 'ok' });
		expect(await authors.follow(reader.id, 'priya-lindqvist')).toEqual({ kind: 'ok' });
		let page = (await authors.authorPage('priya-lindqvist', reader.id))!;
		expect(page.followers).toBe(1);
		expect(page.following).toBe(true);
		expect(await authors.followedBy(reader.id)).toEqual([
			{ handle: 'priya-lindqvist', name: 'Priya Lindqvist' }
		]);
		expect(await authors.unfollow(reader.id, 'priya-lindqvist')).toEqual({ kind: 'ok' });
		page = (await authors.authorPage('priya-lindqvist', reader.id))!;
		expect([page.followers, page.following]).toEqual([0, false]);
		const priya = (await User.findOne({ where: { handle: 'priya-lindqvist' } }))!;
		expect(await authors.follow(priya.id, 'priya-lindqvist')).toEqual({
			kind: 'conflict',
			message: 'You cannot follow yourself.'
		});
		expect(await authors.follow(reader.id, reader.handle)).toEqual({ kind: 'not_found' });
	});

	it('a handle someone else has is a field error; a free one moves the page', async () => {
		const priya = (await User.findOne({ where: { handle: 'priya-lindqvist' } }))!;
		expect(await authors.updateProfile(priya.id, { handle: 'tobias-wren', bio: '' })).toEqual({
			kind: 'invalid',
			issues: { handle: ['That handle is taken. Try another.'] }
		});
		expect(
			await authors.updateProfile(priya.id, { handle: 'priya-builds', bio: 'Quiet small builds.' })
		).toEqual({
			kind: 'ok'
		});
		expect(await authors.authorPage('priya-lindqvist', null)).toBeNull();
		expect((await authors.authorPage('priya-builds', null))!.bio).toBe('Quiet small builds.');
	});
});
