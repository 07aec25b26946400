import { beforeEach, describe, expect, it } from 'vitest';
import { AuditEvent, Part, Quote, Region, Store, User } from '../../src/lib/server/db';
import * as catalogParts from '../../src/lib/server/services/catalog-parts';
import * as catalogReads from '../../src/lib/server/services/catalog-reads';
import * as catalogStores from '../../src/lib/server/services/catalog-stores';
import { countRows, resetDatabase } from '../support/db';

/*
 * Catalog upkeep on the real MariaDB: every refused input comes back as field messages
 * and leaves no row (part, store, quote or audit event) behind; every accepted write
 * has its audit event.
 */

const GPU_SPECS = {
	chip: 'Lumen 60',
	vramGb: 8,
	lengthMm: 242,
	slotWidth: 2,
	boardPowerW: 165,
	powerConnectors: { pin6: 0, pin8: 1, h12v2x6: 0 },
	pcieGen: 4
};

async function editor() {
	return User.create({ email: 'ed@example.test', name: 'Eda Ledger', role: 'editor' });
}

async function regionsAndStore() {
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
	const usStore = await Store.create({
		name: 'Kestrel Components',
		regionId: us.id,
		url: 'https://kestrel.example'
	});
	const jpStore = await Store.create({
		name: 'Kairo Denki',
		regionId: jp.id,
		url: 'https://kairo.example'
	});
	const kwStore = await Store.create({
		name: 'Gulf Parts',
		regionId: kw.id,
		url: 'https://gulf.example'
	});
	return { us, jp, kw, usStore, jpStore, kwStore };
}

describe('parts', () => {
	beforeEach(resetDatabase);

	it('creates a part with valid specs, derives the slug, and audits it', async () => {
		const me = await editor();
		const outcome = await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Example Graphics',
			model: 'Lumen 60 Dual',
			slug: '',
			specs: GPU_SPECS
		});
		expect(outcome).toMatchObject({
			kind: 'ok',
			part: { slug: 'example-graphics-lumen-60-dual', category: 'gpu' }
		});
		const part = await Part.findOne({ where: { slug: 'example-graphics-lumen-60-dual' } });
		expect(part?.specs).toEqual(GPU_SPECS);
		const events = await AuditEvent.findAll({ where: { action: 'part.created' } });
		expect(events).toHaveLength(1);
		expect(events[0]).toMatchObject({
			actorId: me.id,
			subjectType: 'part',
			subjectId: String(part?.id)
		});
		expect(events[0]?.after).toMatchObject({
			slug: 'example-graphics-lumen-60-dual',
			specs: GPU_SPECS
		});
	});

	it('refuses bad specs with a message per field and writes nothing', async () => {
		const me = await editor();
		const outcome = await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: '=HYPERLINK("x")',
			model: '',
			slug: 'Not A Slug',
			specs: {
				...GPU_SPECS,
				vramGb: -8,
				lengthMm: 'long',
				pcieGen: 7,
				powerConnectors: { pin6: 0, pin8: 1 },
				colour: 'red'
			}
		});
		expect(outcome.kind).toBe('invalid');
		if (outcome.kind !== 'invalid') return;
		expect(Object.keys(outcome.issues).sort()).toEqual(
			[
				'brand',
				'model',
				'slug',
				'spec',
				'spec.lengthMm',
				'spec.pcieGen',
				'spec.powerConnectors.h12v2x6',
				'spec.vramGb'
			].sort()
		);
		expect(outcome.issues['spec.vramGb']).toEqual(['Must be more than 0.']);
		expect(outcome.issues['spec.lengthMm']).toEqual(['Enter a number.']);
		expect(outcome.issues['spec.pcieGen']).toEqual(['Choose one of: 3, 4, 5.']);
		expect(outcome.issues['spec.powerConnectors.h12v2x6']).toEqual(['Required.']);
		expect(outcome.issues.spec).toEqual(['Unknown field: colour.']);
		expect(outcome.issues.brand?.[0]).toMatch(/formula/);
		expect(await countRows('parts')).toBe(0);
		expect(await countRows('audit_events')).toBe(0);
	});

	it('refuses an unknown category and a duplicate slug, writing nothing', async () => {
		const me = await editor();
		const unknown = await catalogParts.createPart(me.id, {
			category: 'toaster',
			brand: 'A',
			model: 'B',
			specs: {}
		});
		expect(unknown).toMatchObject({
			kind: 'invalid',
			issues: { category: [expect.stringMatching(/Choose one of: cpu/)] }
		});
		// An absurd size: a 5-metre graphics card (the spec schema caps lengthMm).
		const huge = await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'A',
			model: 'B',
			specs: { ...GPU_SPECS, lengthMm: 5000 }
		});
		expect(huge).toMatchObject({
			kind: 'invalid',
			issues: { 'spec.lengthMm': [expect.stringMatching(/^Must be at most \d+\.$/)] }
		});
		expect(await countRows('parts')).toBe(0);

		await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Example Graphics',
			model: 'Lumen 60',
			slug: 'lumen-60',
			specs: GPU_SPECS
		});
		const again = await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Other',
			model: 'Card',
			slug: 'lumen-60',
			specs: GPU_SPECS
		});
		expect(again).toMatchObject({
			kind: 'invalid',
			issues: { slug: [expect.stringMatching(/already exists/)] }
		});
		expect(await countRows('parts')).toBe(1);
		expect(await AuditEvent.count({ where: { action: 'part.created' } })).toBe(1);
	});

	it('updates brand, model and specs (not category or slug), audits before and after, and skips no-op saves', async () => {
		const me = await editor();
		await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Example Graphics',
			model: 'Lumen 60',
			slug: 'lumen-60',
			specs: GPU_SPECS
		});
		const bad = await catalogParts.updatePart(me.id, 'lumen-60', {
			brand: 'Example Graphics',
			model: 'Lumen 60',
			specs: { ...GPU_SPECS, lengthMm: 0 }
		});
		expect(bad).toMatchObject({
			kind: 'invalid',
			issues: { 'spec.lengthMm': ['Must be more than 0.'] }
		});
		expect((await Part.findOne({ where: { slug: 'lumen-60' } }))?.specs).toEqual(GPU_SPECS);

		const good = await catalogParts.updatePart(me.id, 'lumen-60', {
			brand: 'Example Graphics',
			model: 'Lumen 60 OC',
			specs: { ...GPU_SPECS, lengthMm: 250 }
		});
		expect(good).toMatchObject({
			kind: 'ok',
			changed: true,
			part: { model: 'Lumen 60 OC', category: 'gpu', slug: 'lumen-60' }
		});
		const event = await AuditEvent.findOne({ where: { action: 'part.updated' } });
		expect(event?.before).toMatchObject({ model: 'Lumen 60', specs: { lengthMm: 242 } });
		expect(event?.after).toMatchObject({ model: 'Lumen 60 OC', specs: { lengthMm: 250 } });

		const same = await catalogParts.updatePart(me.id, 'lumen-60', {
			brand: 'Example Graphics',
			model: 'Lumen 60 OC',
			specs: { ...GPU_SPECS, lengthMm: 250 }
		});
		expect(same).toMatchObject({ kind: 'ok', changed: false });
		expect(await AuditEvent.count({ where: { action: 'part.updated' } })).toBe(1);
		expect(
			await catalogParts.updatePart(me.id, 'no-such-part', { brand: 'x', model: 'y', specs: {} })
		).toEqual({ kind: 'not_found' });
	});

	it('lists and searches parts by words (as the public parts search) or by slug, with LIKE wildcards taken literally', async () => {
		const me = await editor();
		await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Example Graphics',
			model: 'Lumen 60',
			specs: GPU_SPECS
		});
		await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Other_Brand',
			model: '100% Card',
			specs: GPU_SPECS
		});
		expect(
			(await catalogReads.listParts({ q: 'lumen', page: 1 })).items.map((p) => p.slug)
		).toEqual(['example-graphics-lumen-60']);
		// "%" is no wildcard: alone it must begin a brand or model, and none does.
		expect((await catalogReads.listParts({ q: '%', page: 1 })).items).toEqual([]);
		expect(
			(await catalogReads.listParts({ q: '100% card', page: 1 })).items.map((p) => p.model)
		).toEqual(['100% Card']);
		// A short word alone begins the brand or the model: "lu" finds "Lumen 60".
		expect((await catalogReads.listParts({ q: 'lu', page: 1 })).items.map((p) => p.model)).toEqual([
			'Lumen 60'
		]);
		// A slug pasted from an address finds its part.
		expect(
			(await catalogReads.listParts({ q: 'other-brand-100-card', page: 1 })).items.map(
				(p) => p.brand
			)
		).toEqual(['Other_Brand']);
		expect((await catalogReads.listParts({ q: '', category: 'cpu', page: 1 })).total).toBe(0);
		expect((await catalogReads.listParts({ q: '', category: 'gpu', page: 1 })).total).toBe(2);
		// The start of a slug finds every part whose slug begins so, even when no word of the
		// brand or model does (an import batch's slugs share their first word). A lone "%"
		// above found nothing through the slug either.
		await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Example Graphics',
			model: 'Lumen 70',
			slug: 'batch7q-lumen-70',
			specs: GPU_SPECS
		});
		expect(
			(await catalogReads.listParts({ q: 'batch7q', page: 1 })).items.map((p) => p.slug)
		).toEqual(['batch7q-lumen-70']);
	});
});

describe('stores', () => {
	beforeEach(resetDatabase);

	it('adds, renames and removes a store with audit events; refuses unknown regions, bad URLs and taken names', async () => {
		const me = await editor();
		const { usStore } = await regionsAndStore();
		const before = await countRows('stores');

		const bad = await catalogStores.createStore(me.id, {
			name: '',
			regionCode: 'zz',
			url: 'javascript:alert(1)'
		});
		expect(bad).toMatchObject({ kind: 'invalid' });
		if (bad.kind === 'invalid') expect(Object.keys(bad.issues).sort()).toEqual(['name', 'url']);
		const unknownRegion = await catalogStores.createStore(me.id, {
			name: 'New Shop',
			regionCode: 'zz',
			url: 'https://new.example'
		});
		expect(unknownRegion).toEqual({
			kind: 'invalid',
			issues: { regionCode: ['Unknown region "zz".'] }
		});
		const taken = await catalogStores.createStore(me.id, {
			name: 'Kestrel Components',
			regionCode: 'us',
			url: 'https://k.example'
		});
		expect(taken).toMatchObject({
			kind: 'invalid',
			issues: { name: [expect.stringMatching(/already exists/)] }
		});
		expect(await countRows('stores')).toBe(before);
		expect(await countRows('audit_events')).toBe(0);

		const created = await catalogStores.createStore(me.id, {
			name: 'New Shop',
			regionCode: 'jp',
			url: 'https://new.example'
		});
		expect(created.kind).toBe('ok');
		if (created.kind !== 'ok') return;
		const renamed = await catalogStores.updateStore(me.id, created.storeId, {
			name: 'Newer Shop',
			regionCode: 'us',
			url: 'https://newer.example'
		});
		expect(renamed.kind).toBe('ok');
		const clash = await catalogStores.updateStore(me.id, created.storeId, {
			name: 'Kestrel Components',
			regionCode: 'us',
			url: 'https://newer.example'
		});
		expect(clash.kind).toBe('invalid');
		expect(await catalogStores.deleteStore(me.id, created.storeId)).toEqual({ kind: 'ok' });
		expect(await Store.findByPk(created.storeId)).toBeNull();
		expect((await AuditEvent.findAll({ order: [['id', 'ASC']] })).map((e) => e.action)).toEqual([
			'store.created',
			'store.updated',
			'store.deleted'
		]);

		const listed = await catalogReads.listStores();
		expect(listed.find((s) => s.id === usStore.id)).toMatchObject({
			region: { code: 'us', currency: 'USD' },
			quoteCount: 0
		});
	});

	it('refuses to remove a store that has quotes', async () => {
		const me = await editor();
		const { usStore } = await regionsAndStore();
		await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Example Graphics',
			model: 'Lumen 60',
			slug: 'lumen-60',
			specs: GPU_SPECS
		});
		await catalogStores.addQuote(me.id, {
			partSlug: 'lumen-60',
			storeId: String(usStore.id),
			amount: '249.99',
			observedOn: '2024-01-02'
		});
		expect(await catalogStores.deleteStore(me.id, usStore.id)).toMatchObject({
			kind: 'conflict',
			message: expect.stringMatching(/1 quote/)
		});
		expect(await Store.findByPk(usStore.id)).not.toBeNull();
		expect((await catalogReads.listStores()).find((s) => s.id === usStore.id)?.quoteCount).toBe(1);
	});
});

describe('quotes', () => {
	beforeEach(resetDatabase);

	async function setup() {
		const me = await editor();
		const places = await regionsAndStore();
		await catalogParts.createPart(me.id, {
			category: 'gpu',
			brand: 'Example Graphics',
			model: 'Lumen 60',
			slug: 'lumen-60',
			specs: GPU_SPECS
		});
		await AuditEvent.destroy({ where: {} });
		return { me, ...places };
	}

	// Minor units per ISO 4217 List One (docs/sources.md 10a, status V): USD 2, JPY 0, KWD 3.
	it('converts decimal amounts with the currency exponent (USD 2, JPY 0, KWD 3; ISO 4217, docs/sources.md 10a, V)', async () => {
		const { me, usStore, jpStore, kwStore } = await setup();
		const usd = await catalogStores.addQuote(me.id, {
			partSlug: 'lumen-60',
			storeId: String(usStore.id),
			amount: '249.99',
			shipping: '5',
			taxIncluded: '',
			observedOn: '2024-01-02'
		});
		const jpy = await catalogStores.addQuote(me.id, {
			partSlug: 'lumen-60',
			storeId: String(jpStore.id),
			amount: '38980',
			taxIncluded: 'on',
			observedOn: '2024-01-02'
		});
		const kwd = await catalogStores.addQuote(me.id, {
			partSlug: 'lumen-60',
			storeId: String(kwStore.id),
			amount: '76.125',
			observedOn: '2024-01-02'
		});
		expect([usd.kind, jpy.kind, kwd.kind]).toEqual(['ok', 'ok', 'ok']);
		const quotes = await Quote.findAll({ order: [['id', 'ASC']] });
		expect(
			quotes.map((q) => [
				Number(q.amountMinor),
				q.currency,
				Number(q.shippingMinor),
				q.taxIncluded,
				q.source
			])
		).toEqual([
			[24999, 'USD', 500, false, 'editor'],
			[38980, 'JPY', 0, true, 'editor'],
			[76125, 'KWD', 0, false, 'editor']
		]);
		expect(quotes[0]?.observedAt.toISOString()).toBe('2024-01-02T12:00:00.000Z');
		expect(await AuditEvent.count({ where: { action: 'quote.created' } })).toBe(3);
		const recent = await catalogReads.listRecentQuotes({ partSlug: 'lumen-60' });
		expect(recent).toHaveLength(3);
	});

	it('refuses a price with more decimals than the currency allows ("12.345" USD, "100.5" JPY) and writes nothing', async () => {
		const { me, usStore, jpStore } = await setup();
		const usd = await catalogStores.addQuote(me.id, {
			partSlug: 'lumen-60',
			storeId: String(usStore.id),
			amount: '12.345',
			observedOn: '2024-01-02'
		});
		expect(usd).toEqual({
			kind: 'invalid',
			issues: { amount: ['USD allows at most 2 decimals, e.g. 129.99.'] }
		});
		const jpy = await catalogStores.addQuote(me.id, {
			partSlug: 'lumen-60',
			storeId: String(jpStore.id),
			amount: '100.5',
			observedOn: '2024-01-02'
		});
		expect(jpy).toEqual({
			kind: 'invalid',
			issues: { amount: ['JPY has no minor unit: enter a whole amount, e.g. 15800.'] }
		});
		const shipping = await catalogStores.addQuote(me.id, {
			partSlug: 'lumen-60',
			storeId: String(usStore.id),
			amount: '12.34',
			shipping: '1.999',
			observedOn: '2024-01-02'
		});
		expect(shipping).toMatchObject({
			kind: 'invalid',
			issues: { shipping: [expect.stringMatching(/at most 2 decimals/)] }
		});
		expect(await countRows('quotes')).toBe(0);
		expect(await countRows('audit_events')).toBe(0);
	});

	it('refuses unknown currency, unknown or mismatched region, unknown part, bad and future dates', async () => {
		const { me, usStore } = await setup();
		const base = {
			partSlug: 'lumen-60',
			storeId: String(usStore.id),
			amount: '249.99',
			observedOn: '2024-01-02'
		};
		expect(await catalogStores.addQuote(me.id, { ...base, currency: 'XYZ' })).toEqual({
			kind: 'invalid',
			issues: { currency: ['Unknown currency code "XYZ".'] }
		});
		expect(await catalogStores.addQuote(me.id, { ...base, currency: 'dollars' })).toMatchObject({
			kind: 'invalid',
			issues: { currency: [expect.stringMatching(/three-letter/)] }
		});
		expect(await catalogStores.addQuote(me.id, { ...base, regionCode: 'zz' })).toEqual({
			kind: 'invalid',
			issues: { regionCode: ['Unknown region "zz".'] }
		});
		expect(await catalogStores.addQuote(me.id, { ...base, regionCode: 'jp' })).toMatchObject({
			kind: 'invalid',
			issues: { regionCode: [expect.stringMatching(/sells in United States/)] }
		});
		expect(
			await catalogStores.addQuote(me.id, { ...base, partSlug: 'no-such-part' })
		).toMatchObject({
			kind: 'invalid',
			issues: { partSlug: [expect.stringMatching(/No part/)] }
		});
		expect(await catalogStores.addQuote(me.id, { ...base, amount: '-5' })).toMatchObject({
			kind: 'invalid',
			issues: { amount: [expect.any(String)] }
		});
		expect(await catalogStores.addQuote(me.id, { ...base, amount: '0.00' })).toMatchObject({
			kind: 'invalid',
			issues: { amount: ['The price must be more than zero.'] }
		});
		expect(
			await catalogStores.addQuote(me.id, { ...base, observedOn: '2024-02-30' })
		).toMatchObject({
			kind: 'invalid',
			issues: { observedOn: ['Enter a real date.'] }
		});
		expect(
			await catalogStores.addQuote(me.id, { ...base, observedOn: '2999-01-01' })
		).toMatchObject({
			kind: 'invalid',
			issues: { observedOn: ['The day cannot be in the future.'] }
		});
		expect(await catalogStores.addQuote(me.id, { ...base, storeId: 'abc' })).toMatchObject({
			kind: 'invalid',
			issues: { storeId: ['Unknown store.'] }
		});
		expect(await catalogStores.addQuote(me.id, { ...base, sneaky: '1' })).toMatchObject({
			kind: 'invalid',
			issues: { _form: [expect.any(String)] }
		});
		expect(await countRows('quotes')).toBe(0);
		expect(await countRows('audit_events')).toBe(0);
	});
});
