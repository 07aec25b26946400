import { beforeEach, describe, expect, it } from 'vitest';
import { fieldIssues } from '../../src/lib/schemas/issues';
import { priceSightingInput, rejectSightingInput } from '../../src/lib/schemas/price-sightings';
import {
	AuditEvent,
	Part,
	PriceSighting,
	Quote,
	Region,
	Store,
	User
} from '../../src/lib/server/db';
import * as parts from '../../src/lib/server/services/parts';
import * as sightingReads from '../../src/lib/server/services/price-sighting-reads';
import * as sightings from '../../src/lib/server/services/price-sightings';
import { countRows, resetDatabase } from '../support/db';

/*
 * Price sightings on the real MariaDB: reports are merged per part, store, region, amount
 * and UTC day; a verification turns a sighting into a Quote in the part's price history in
 * one transaction with its audit event; a decision on a sighting that is no longer pending
 * is a conflict; refused input writes nothing.
 */

// A fixed "now" so the date window (today back to 90 days) does not depend on the clock.
const NOW = new Date('2026-11-20T15:00:00Z');
const TODAY = '2026-11-20';
const YESTERDAY = '2026-11-19';

const GPU_SPECS = {
	chip: 'Lumen 60',
	vramGb: 8,
	lengthMm: 242,
	slotWidth: 2,
	boardPowerW: 165,
	powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
	pcieGen: 4
};

async function world() {
	const us = await Region.create({
		code: 'us',
		name: 'United States',
		currency: 'USD',
		taxMode: 'exclusive',
		taxRateBp: 0,
		categoryFactorsBp: {}
	});
	const jp = await Region.create({
		code: 'jp',
		name: 'Japan',
		currency: 'JPY',
		taxMode: 'inclusive',
		taxRateBp: 1000,
		categoryFactorsBp: {}
	});
	const kw = await Region.create({
		code: 'kw',
		name: 'Kuwait',
		currency: 'KWD',
		taxMode: 'exclusive',
		taxRateBp: 0,
		categoryFactorsBp: {}
	});
	const kestrel = await Store.create({
		name: 'Kestrel Components',
		regionId: us.id,
		url: 'https://kestrel.example'
	});
	const harbor = await Store.create({
		name: 'Harbor Bits',
		regionId: us.id,
		url: 'https://harbor.example'
	});
	const kairo = await Store.create({
		name: 'Kairo Denki',
		regionId: jp.id,
		url: 'https://kairo.example'
	});
	const gulf = await Store.create({
		name: 'Gulf Parts',
		regionId: kw.id,
		url: 'https://gulf.example'
	});
	const part = await Part.create({
		category: 'gpu',
		brand: 'Example Graphics',
		model: 'Lumen 60 Dual',
		slug: 'example-graphics-lumen-60-dual',
		specs: GPU_SPECS
	});
	const reader = await User.create({
		email: 'rosa@example.test',
		name: 'Rosa Vale',
		role: 'reader'
	});
	const reader2 = await User.create({
		email: 'tam@example.test',
		name: 'Tam Oduya',
		role: 'reader'
	});
	const editor = await User.create({
		email: 'ed@example.test',
		name: 'Eda Ledger',
		role: 'editor'
	});
	const editor2 = await User.create({
		email: 'ned@example.test',
		name: 'Ned Ferris',
		role: 'editor'
	});
	return { us, jp, kw, kestrel, harbor, kairo, gulf, part, reader, reader2, editor, editor2 };
}

type World = Awaited<ReturnType<typeof world>>;

function form(w: World, overrides: Record<string, string> = {}) {
	return {
		regionCode: 'us',
		storeId: String(w.kestrel.id),
		price: '249.99',
		observedOn: YESTERDAY,
		url: 'https://kestrel.example/p/lumen-60-dual',
		...overrides
	};
}

async function writtenRows() {
	return {
		sightings: await countRows('price_sightings'),
		reports: await countRows('price_sighting_reports'),
		quotes: await countRows('quotes'),
		audit: await countRows('audit_events')
	};
}

describe('price sightings on the real MariaDB', () => {
	let w: World;
	beforeEach(async () => {
		await resetDatabase();
		w = await world();
	});

	describe('submit', () => {
		it('files a pending sighting in minor units of the region currency', async () => {
			const outcome = await sightings.submit(w.reader.id, w.part.slug, form(w), NOW);
			expect(outcome.kind).toBe('created');
			const row = await PriceSighting.findOne();
			expect(row).toMatchObject({
				state: 'pending',
				currency: 'USD',
				observedOn: YESTERDAY,
				seenCount: 1,
				submittedById: w.reader.id
			});
			// ISO 4217 List One (docs/sources.md 10a, V): USD has 2 minor-unit digits, so 249.99 → 24999.
			expect(Number(row?.amountMinor)).toBe(24999);

			// ISO 4217 List One (10a, V): JPY has 0 digits, KWD has 3.
			expect(
				(
					await sightings.submit(
						w.reader.id,
						w.part.slug,
						form(w, { regionCode: 'jp', storeId: String(w.kairo.id), price: '38800' }),
						NOW
					)
				).kind
			).toBe('created');
			expect(
				(
					await sightings.submit(
						w.reader.id,
						w.part.slug,
						form(w, { regionCode: 'kw', storeId: String(w.gulf.id), price: '76.125' }),
						NOW
					)
				).kind
			).toBe('created');
			const amounts = (await PriceSighting.findAll({ order: [['id', 'ASC']] })).map((s) => [
				s.currency,
				Number(s.amountMinor)
			]);
			expect(amounts).toEqual([
				['USD', 24999],
				['JPY', 38800],
				['KWD', 76125]
			]);

			const mine = await sightingReads.listMine(w.reader.id, w.part.slug);
			expect(mine).toHaveLength(3);
			expect(mine.every((s) => s.state === 'pending')).toBe(true);
			expect(await sightingReads.listMine(w.reader2.id, w.part.slug)).toEqual([]);
		});

		it('merges a report of the same price, store and day into the pending one, counting people', async () => {
			const first = await sightings.submit(w.reader.id, w.part.slug, form(w), NOW);
			const second = await sightings.submit(
				w.reader2.id,
				w.part.slug,
				form(w, { url: 'http://kestrel.example/other-link' }),
				NOW
			);
			expect(first.kind).toBe('created');
			expect(second).toMatchObject({ kind: 'merged', seenCount: 2 });
			if (first.kind !== 'created' || second.kind !== 'merged') throw new Error('unexpected');
			expect(second.sightingId).toBe(first.sightingId);

			const rows = await PriceSighting.findAll();
			expect(rows).toHaveLength(1);
			// The earliest submitter and their link stay.
			expect(rows[0]).toMatchObject({
				seenCount: 2,
				submittedById: w.reader.id,
				url: 'https://kestrel.example/p/lumen-60-dual'
			});
			expect(await countRows('price_sighting_reports')).toBe(2);
			// The merged-in reporter sees it in their own list too.
			expect(await sightingReads.listMine(w.reader2.id, w.part.slug)).toMatchObject([
				{ seenCount: 2, state: 'pending' }
			]);

			// The same person again is not a second person.
			const again = await sightings.submit(w.reader.id, w.part.slug, form(w), NOW);
			expect(again).toMatchObject({ kind: 'already_reported', state: 'pending' });
			expect((await PriceSighting.findByPk(first.sightingId))?.seenCount).toBe(2);
		});

		it('does not merge across days, stores or amounts', async () => {
			await sightings.submit(w.reader.id, w.part.slug, form(w), NOW);
			expect(
				(await sightings.submit(w.reader2.id, w.part.slug, form(w, { observedOn: TODAY }), NOW))
					.kind
			).toBe('created');
			expect(
				(
					await sightings.submit(
						w.reader2.id,
						w.part.slug,
						form(w, { storeId: String(w.harbor.id) }),
						NOW
					)
				).kind
			).toBe('created');
			expect(
				(await sightings.submit(w.reader2.id, w.part.slug, form(w, { price: '249.98' }), NOW)).kind
			).toBe('created');
			expect(await countRows('price_sightings')).toBe(4);
			expect((await PriceSighting.findAll()).every((s) => s.seenCount === 1)).toBe(true);
		});

		it('merges simultaneous reports of one price into one row (part row lock)', async () => {
			const people = await Promise.all(
				[1, 2, 3, 4].map((n) =>
					User.create({ email: `p${n}@example.test`, name: `Person ${n}`, role: 'reader' })
				)
			);
			const outcomes = await Promise.all(
				people.map((p) => sightings.submit(p.id, w.part.slug, form(w), NOW))
			);
			expect(outcomes.filter((o) => o.kind === 'created')).toHaveLength(1);
			expect(outcomes.filter((o) => o.kind === 'merged')).toHaveLength(3);
			const rows = await PriceSighting.findAll();
			expect(rows).toHaveLength(1);
			expect(rows[0]?.seenCount).toBe(4);
		});

		it('refuses bad input with a message per field and writes nothing', async () => {
			const before = await writtenRows();
			const cases: [Record<string, string>, string][] = [
				[{ observedOn: '2026-11-21' }, 'observedOn'], // tomorrow (UTC)
				[{ observedOn: '2026-08-21' }, 'observedOn'], // 91 days back
				[{ observedOn: '2026-02-30' }, 'observedOn'],
				[{ url: 'javascript:alert(1)' }, 'url'],
				[{ url: 'ftp://kestrel.example/file' }, 'url'],
				[{ url: '' }, 'url'],
				[{ price: '249.999' }, 'price'], // USD: 2 digits (ISO 4217, 10a)
				[{ regionCode: 'jp', storeId: String(w.kairo.id), price: '38800.5' }, 'price'], // JPY: 0 digits
				[{ price: '0' }, 'price'],
				[{ price: '-5' }, 'price'],
				[{ price: '12,50' }, 'price'],
				[{ storeId: String(w.kairo.id) }, 'storeId'], // a Japanese store in the US region
				[{ storeId: '999999' }, 'storeId'],
				[{ regionCode: 'zz' }, 'regionCode']
			];
			for (const [overrides, field] of cases) {
				const outcome = await sightings.submit(w.reader.id, w.part.slug, form(w, overrides), NOW);
				expect(outcome.kind, JSON.stringify(overrides)).toBe('invalid');
				if (outcome.kind !== 'invalid') continue;
				expect(Object.keys(outcome.issues), JSON.stringify(overrides)).toContain(field);
				expect(outcome.issues[field]?.[0]).toMatch(/\w/);
			}
			// The oldest day allowed is exactly 90 days back (common practice, no published source).
			expect(
				(
					await sightings.submit(
						w.reader.id,
						w.part.slug,
						form(w, { observedOn: '2026-08-22' }),
						NOW
					)
				).kind
			).toBe('created');
			const { sightings: s, reports, ...rest } = await writtenRows();
			expect({ sightings: s - 1, reports: reports - 1, ...rest }).toEqual(before);

			expect(await sightings.submit(w.reader.id, 'no-such-part', form(w), NOW)).toEqual({
				kind: 'not_found'
			});
			expect(
				await sightings.submit(w.reader.id, w.part.slug, { ...form(w), extra: 'x' }, NOW)
			).toMatchObject({ kind: 'invalid' });
		});

		it('the schema alone reports field issues for missing fields', () => {
			const result = priceSightingInput(NOW).safeParse({});
			expect(result.success).toBe(false);
			if (result.success) return;
			expect(Object.keys(fieldIssues(result.error)).sort()).toEqual([
				'observedOn',
				'price',
				'regionCode',
				'storeId',
				'url'
			]);
		});
	});

	describe('decisions', () => {
		async function pendingId(overrides: Record<string, string> = {}) {
			const outcome = await sightings.submit(w.reader.id, w.part.slug, form(w, overrides), NOW);
			if (outcome.kind !== 'created') throw new Error(`not created: ${outcome.kind}`);
			return outcome.sightingId;
		}

		it('verify creates a sighting quote that shows in the price history, with an audit event', async () => {
			const id = await pendingId({ regionCode: 'jp', storeId: String(w.kairo.id), price: '38800' });
			const outcome = await sightings.verify(w.editor.id, id, NOW);
			expect(outcome.kind).toBe('ok');
			if (outcome.kind !== 'ok' || outcome.quoteId === null) throw new Error('no quote');

			const quote = await Quote.findByPk(outcome.quoteId);
			expect(quote).toMatchObject({
				source: 'sighting',
				currency: 'JPY',
				taxIncluded: true,
				url: 'https://kestrel.example/p/lumen-60-dual'
			});
			expect(Number(quote?.amountMinor)).toBe(38800);
			expect(quote?.observedAt.toISOString()).toBe(`${YESTERDAY}T12:00:00.000Z`);
			expect(await PriceSighting.findByPk(id)).toMatchObject({
				state: 'verified',
				decidedById: w.editor.id,
				quoteId: outcome.quoteId
			});

			const detail = await parts.getBySlug(w.part.slug);
			expect(detail?.history).toEqual([
				{
					regionCode: 'jp',
					regionName: 'Japan',
					storeName: 'Kairo Denki',
					currency: 'JPY',
					points: [{ observedAt: `${YESTERDAY}T12:00:00.000Z`, amountMinor: 38800 }]
				}
			]);

			const events = await AuditEvent.findAll({ where: { action: 'price_sighting.verified' } });
			expect(events).toHaveLength(1);
			expect(events[0]).toMatchObject({
				actorId: w.editor.id,
				subjectType: 'price_sighting',
				subjectId: String(id)
			});
			expect(events[0]?.after).toMatchObject({
				state: 'verified',
				quoteId: outcome.quoteId,
				amountMinor: 38800
			});
			expect(await sightingReads.listMine(w.reader.id, w.part.slug)).toMatchObject([
				{ state: 'verified' }
			]);

			// A later report of the verified price joins it: counted, but no second quote.
			const late = await sightings.submit(
				w.reader2.id,
				w.part.slug,
				form(w, { regionCode: 'jp', storeId: String(w.kairo.id), price: '38800' }),
				NOW
			);
			expect(late).toMatchObject({ kind: 'merged_verified', sightingId: id, seenCount: 2 });
			expect(await countRows('quotes')).toBe(1);
			expect(await countRows('price_sightings')).toBe(1);
		});

		it('answers politely when the same price is already a quote from an editor, and writes nothing', async () => {
			await Quote.create({
				partId: w.part.id,
				storeId: w.kestrel.id,
				regionId: w.us.id,
				amountMinor: 24999,
				currency: 'USD',
				taxIncluded: false,
				observedAt: new Date(`${YESTERDAY}T09:30:00Z`),
				url: null,
				source: 'editor'
			});
			expect(await sightings.submit(w.reader.id, w.part.slug, form(w), NOW)).toEqual({
				kind: 'already_quoted'
			});
			expect(await countRows('price_sightings')).toBe(0);
		});

		it('reject requires a reason; with one, the reporter sees it', async () => {
			const id = await pendingId();
			const parsed = rejectSightingInput.safeParse({ sightingId: String(id), reason: '  ' });
			expect(parsed.success).toBe(false);
			if (!parsed.success) expect(fieldIssues(parsed.error).reason?.[0]).toMatch(/why/);

			expect(await sightings.reject(w.editor.id, id, '')).toMatchObject({
				kind: 'invalid',
				issues: { reason: [expect.any(String)] }
			});
			expect(await PriceSighting.findByPk(id)).toMatchObject({
				state: 'pending',
				rejectReason: null
			});
			expect(await countRows('audit_events')).toBe(0);

			const reason = 'The link shows a different model (the 40 Solo).';
			expect(await sightings.reject(w.editor.id, id, reason, NOW)).toEqual({
				kind: 'ok',
				quoteId: null
			});
			expect(await PriceSighting.findByPk(id)).toMatchObject({
				state: 'rejected',
				rejectReason: reason,
				decidedById: w.editor.id
			});
			expect(await countRows('quotes')).toBe(0);
			const events = await AuditEvent.findAll({ where: { action: 'price_sighting.rejected' } });
			expect(events).toHaveLength(1);
			expect(events[0]?.after).toMatchObject({ state: 'rejected', rejectReason: reason });
			expect(await sightingReads.listMine(w.reader.id, w.part.slug)).toMatchObject([
				{ state: 'rejected', rejectReason: reason }
			]);

			// A rejected sighting is not merged into: the same report starts a new pending one.
			expect((await sightings.submit(w.reader2.id, w.part.slug, form(w), NOW)).kind).toBe(
				'created'
			);
		});

		it('a second decision on the same sighting is a conflict and changes nothing', async () => {
			const id = await pendingId();
			expect((await sightings.verify(w.editor.id, id, NOW)).kind).toBe('ok');
			const again = await sightings.verify(w.editor2.id, id, NOW);
			expect(again).toMatchObject({
				kind: 'conflict',
				message: expect.stringMatching(/already verified/)
			});
			expect((await sightings.reject(w.editor2.id, id, 'Wrong price.', NOW)).kind).toBe('conflict');
			expect(await countRows('quotes')).toBe(1);
			expect(await countRows('audit_events')).toBe(1);
			expect(await PriceSighting.findByPk(id)).toMatchObject({
				state: 'verified',
				decidedById: w.editor.id
			});
			expect(await sightings.verify(w.editor.id, 987654, NOW)).toEqual({ kind: 'not_found' });
		});

		it('two editors deciding at once: one wins, the other is told', async () => {
			for (let round = 0; round < 4; round++) {
				const id = await pendingId({ price: `${200 + round}.00` });
				const [a, b] = await Promise.all([
					sightings.verify(w.editor.id, id, NOW),
					sightings.reject(w.editor2.id, id, 'Not the price on the page.', NOW)
				]);
				const kinds = [a.kind, b.kind].sort();
				expect(kinds).toEqual(['conflict', 'ok']);
				const row = await PriceSighting.findByPk(id);
				const quotes = await Quote.count({ where: { amountMinor: (200 + round) * 100 } });
				// The winner's decision, and only its effects: a quote exactly when verified.
				expect(quotes).toBe(row?.state === 'verified' ? 1 : 0);
				expect(await AuditEvent.count({ where: { subjectId: String(id) } })).toBe(1);
			}
		});

		it('lists pending sightings oldest first, filtered by region and part words, paged', async () => {
			await pendingId();
			await pendingId({ regionCode: 'jp', storeId: String(w.kairo.id), price: '38800' });
			await pendingId({ price: '199.00' });
			const decided = await pendingId({ price: '150.00' });
			await sightings.reject(w.editor.id, decided, 'Typo in the price.', NOW);

			const all = await sightingReads.listPending({ page: 1, q: '' });
			expect(all.total).toBe(3);
			expect(all.items.map((s) => s.price)).toEqual([
				{ amountMinor: 24999, currency: 'USD' },
				{ amountMinor: 38800, currency: 'JPY' },
				{ amountMinor: 19900, currency: 'USD' }
			]);
			expect(all.items[0]).toMatchObject({
				part: { slug: w.part.slug, name: 'Example Graphics Lumen 60 Dual' },
				storeName: 'Kestrel Components',
				submittedBy: { email: 'rosa@example.test' }
			});

			expect((await sightingReads.listPending({ page: 1, q: '', region: 'jp' })).total).toBe(1);
			expect((await sightingReads.listPending({ page: 1, q: '', region: 'zz' })).total).toBe(0);
			expect((await sightingReads.listPending({ page: 1, q: 'lumen dual' })).total).toBe(3);
			expect((await sightingReads.listPending({ page: 1, q: 'aurora' })).total).toBe(0);

			const page2 = await sightingReads.listPending({ page: 2, q: '' }, 2);
			expect(page2).toMatchObject({ page: 2, pageCount: 2, total: 3 });
			expect(page2.items).toHaveLength(1);
		});
	});
});
