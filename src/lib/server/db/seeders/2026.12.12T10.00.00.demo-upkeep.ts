/*
 * Demo data for upkeep alerts and fork insights (issue 19), after the stored figures (whose
 * pass took each guide's baseline at publication):
 *
 * - prices drift in one region: two picks of the demo author's "steady-1080p-starter" get
 *   dearer at a German store, so its total in de moves +12.9 % (€774.20 → €874.20) and passes
 *   the budget there: the demo author sees alerts on My guides;
 * - fifteen invented readers fork the same guide and change it a little, so its insights page
 *   has counts of 5 and more to chart, and one common swap (the Auric A64 Mini card, 6 of the
 *   builds) that is suggested as an alternate.
 *
 * Forks go through services/build-fork.ts as a reader's would. Idempotent by natural keys:
 * a quote of that part, store, amount and day, a reader's e-mail with a build of the guide.
 */
import { Op } from 'sequelize';
import type { Seeder } from '../umzug.js';
import { Build, BuildSlot, Part, Quote, Region, Store, User } from '../models/index.js';
import { hashPassword } from '../../auth/password.js';
import { fork } from '../../services/build-fork.js';
import { DEMO_PASSWORD } from './demo-community.js';
import { DRIFT, DRIFT_STORE } from './demo-data/upkeep.js';
import * as guidePrices from '../../services/guide-prices.js';

const GUIDE = 'steady-1080p-starter';

/** Invented readers: [name, region, graphics card choice, memory choice, bought the CPU]. */
type Card = 'pick' | 'alternate' | 'swap';
const READERS: [string, string, Card, 'pick' | 'alternate', boolean][] = [
	['Noor Castellan', 'us', 'pick', 'pick', true],
	['Ivo Marchetti-Lund', 'us', 'pick', 'pick', true],
	['Tamsin Okafor', 'us', 'pick', 'alternate', false],
	['Rafe Delacorte', 'us', 'pick', 'pick', true],
	['Suvi Harjanne', 'de', 'pick', 'alternate', false],
	['Lio Brennagh', 'us', 'alternate', 'pick', true],
	['Marisol Quenby', 'us', 'alternate', 'alternate', false],
	['Oskar Feldwin', 'de', 'alternate', 'pick', false],
	['Hana Vořechová', 'de', 'alternate', 'alternate', true],
	['Dev Ambrose-Kell', 'us', 'swap', 'pick', false],
	['Juno Pellerin', 'us', 'swap', 'alternate', true],
	['Wendell Ashcombe', 'us', 'swap', 'pick', false],
	['Priti Varanasi-Holt', 'de', 'swap', 'alternate', false],
	['Emeric Solvang', 'de', 'swap', 'pick', true],
	['Ada Quillfeather', 'us', 'swap', 'alternate', false]
];
const CARD = { alternate: 'ironvale-auric-a52-8g', swap: 'ironvale-auric-a64-mini-12g' };
const MEMORY_ALTERNATE = 'brisk-ddr4-3200-32gb';

function emailOf(name: string): string {
	const local = name
		.normalize('NFD')
		.replace(/[^A-Za-z ]/g, '')
		.toLowerCase()
		.trim()
		.replace(/\s+/g, '.');
	return `${local}@readers.slotwise.test`;
}

async function partId(slug: string): Promise<number> {
	const part = await Part.findOne({ where: { slug }, attributes: ['id'] });
	if (!part) throw new Error(`Demo upkeep: no part ${slug}`);
	return part.id;
}

async function drift(): Promise<number[]> {
	const de = await Region.findOne({ where: { code: 'de' } });
	const store = de ? await Store.findOne({ where: { name: DRIFT_STORE } }) : null;
	if (!de || !store) throw new Error('Demo upkeep: region de or its store missing');
	const today = new Date(new Date().toISOString().slice(0, 10) + 'T00:00:00Z');
	const ids: number[] = [];
	for (const d of DRIFT) {
		const where = { partId: await partId(d.part), storeId: store.id, amountMinor: d.amountMinor };
		const found = await Quote.findOne({ where: { ...where, observedAt: { [Op.gte]: today } } });
		if (found) continue;
		const quote = await Quote.create({
			...where,
			regionId: de.id,
			currency: 'EUR',
			taxIncluded: true,
			observedAt: today,
			url: null,
			source: 'editor'
		});
		ids.push(quote.id);
	}
	return ids;
}

async function forks(): Promise<void> {
	// Like every demo account: the demo password, hashed once for all of them.
	const passwordHash = await hashPassword(DEMO_PASSWORD);
	for (const [name, region, card, memory, bought] of READERS) {
		const email = emailOf(name);
		const [reader] = await User.findOrCreate({
			where: { email },
			defaults: { email, name, passwordHash, role: 'reader', emailVerified: new Date() }
		});
		if (await Build.findOne({ where: { ownerId: reader.id } })) continue;
		const forked = await fork(reader.id, GUIDE);
		if (forked.kind !== 'created') throw new Error(`Demo upkeep: fork of ${GUIDE} failed`);
		const regionRow = await Region.findOne({ where: { code: region } });
		if (!regionRow) throw new Error(`Demo upkeep: no region ${region}`);
		await Build.update({ regionId: regionRow.id }, { where: { id: forked.id } });
		const slot = (label: string) => BuildSlot.findOne({ where: { buildId: forked.id, label } });
		if (card !== 'pick')
			await (
				await slot('Graphics card')
			)?.update({
				partId: await partId(CARD[card]),
				origin: card === 'alternate' ? 'alternate' : 'custom'
			});
		if (memory === 'alternate')
			await (
				await slot('Memory')
			)?.update({
				partId: await partId(MEMORY_ALTERNATE),
				origin: 'alternate'
			});
		if (bought)
			await (
				await slot('CPU')
			)?.update({
				purchased: true,
				purchasedAt: new Date().toISOString().slice(0, 10)
			});
	}
}

export const up: Seeder = async () => {
	const quoteIds = await drift();
	await forks();
	// As an editor's quote would: the stored figures and the upkeep alerts follow.
	if (quoteIds.length > 0) await guidePrices.refreshForQuotes(quoteIds);
};

export const down: Seeder = async () => {
	for (const [name] of READERS) await User.destroy({ where: { email: emailOf(name) } });
	const store = await Store.findOne({ where: { name: DRIFT_STORE } });
	if (store)
		for (const d of DRIFT)
			await Quote.destroy({
				where: { partId: await partId(d.part), storeId: store.id, amountMinor: d.amountMinor }
			});
	await guidePrices.refreshAll();
};
