import { beforeAll, describe, expect, it } from 'vitest';
import { Build, User, sequelize } from '../../src/lib/server/db';
import { seeder } from '../../src/lib/server/db/seeders';
import * as accounts from '../../src/lib/server/services/accounts';
import * as buildFork from '../../src/lib/server/services/build-fork';
import { pageExtras } from '../../src/lib/server/services/guide-page-extras';
import { readStamp } from '../../src/lib/server/services/guide-view-cache';
import { resetDatabase } from '../support/db';

/*
 * The guide page's extras (forks, public builds, gallery, part photos, tips) are kept per
 * stamp and `guide-extras` counter (src/lib/server/services/guide-page-extras.ts). A reader
 * who forks, a builder who renames themselves: the next page read shows it, because their
 * write moved the counter the stamp carries.
 */
const GUIDE = 'steady-1080p-starter';

async function extrasNow() {
	const stamp = (await readStamp(GUIDE))!;
	return pageExtras(GUIDE, stamp, []);
}

beforeAll(async () => {
	await resetDatabase();
	await seeder(sequelize).up();
});

describe('the guide page extras', () => {
	it('are kept while nothing they show has changed', async () => {
		const first = await extrasNow();
		expect(await extrasNow()).toBe(first); // the same object: made once
	});

	it('count a new fork on the next read', async () => {
		const reader = (await User.findOne({ where: { email: 'reader@slotwise.test' } }))!;
		const before = (await extrasNow()).lineage.forkCount;
		const forked = await buildFork.fork(reader.id, GUIDE);
		expect(forked.kind).toBe('created');
		expect((await extrasNow()).lineage.forkCount).toBe(before + 1);
	});

	it('list a build made public, under its owner’s new name once they rename themselves', async () => {
		const reader = (await User.findOne({ where: { email: 'reader@slotwise.test' } }))!;
		const build = (await Build.findOne({ where: { ownerId: reader.id } }))!;
		await build.update({ visibility: 'public' });
		const listed = (await extrasNow()).lineage.publicBuilds.find((b) => b.id === build.id);
		expect(listed?.ownerName).toBe(reader.name);

		await accounts.updateProfile(reader.id, { name: 'Renamed Reader' });
		const renamed = (await extrasNow()).lineage.publicBuilds.find((b) => b.id === build.id);
		expect(renamed?.ownerName).toBe('Renamed Reader');
	});
});
