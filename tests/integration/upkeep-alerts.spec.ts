import { QueryTypes } from 'sequelize';
import { beforeEach, describe, expect, it } from 'vitest';
import { FxRate, Quote, User, sequelize } from '../../src/lib/server/db';
import { seedDemoCommunity } from '../../src/lib/server/db/seeders/demo-community';
import * as catalogStores from '../../src/lib/server/services/catalog-stores';
import * as cautions from '../../src/lib/server/services/caution-rules';
import * as upkeep from '../../src/lib/server/services/upkeep-dashboard';
import { composeDigest } from '../../src/lib/server/services/upkeep-digest';
import { resetDatabase } from '../support/db';
import { quoteAt, store, upkeepGuide, type UpkeepGuide } from '../support/upkeep-fixtures';
import { settled } from '../../src/lib/server/background';

/*
 * Upkeep alerts on the real MariaDB (issue 19): quotes added through the catalog service
 * (the same path an editor takes, which refreshes the stored figures and the alerts), a
 * caution rule added through its service, and the author's dashboard read back.
 *
 * The guide (tests/support/upkeep-fixtures.ts): base region us (prices pre-tax, no tax
 * added), CPU pick "Tollan K6 Test" with the alternate "Tollan K6 Lite Test" (same specs, so
 * it fits as a drop-in), graphics card "Tollan G8 Test", target budget $450.00.
 * At publication: CPU $100.00 (1 day old), alternate $120.00, card $300.00 (40 days old):
 * total $400.00 by hand.
 */

const DAY_MS = 86_400_000;
let g: UpkeepGuide;
let editorId: string;

function today(offsetDays = 0): string {
	return new Date(Date.now() - offsetDays * DAY_MS).toISOString().slice(0, 10);
}

async function addQuote(partSlug: string, regionCode: string, amount: string) {
	const s = await store(regionCode);
	const outcome = await catalogStores.addQuote(editorId, {
		partSlug,
		storeId: String(s.id),
		amount,
		observedOn: today()
	});
	expect(outcome.kind).toBe('ok');
}

/** Alerts stored for the guide as (kind region slot) lines, sorted for comparison. */
async function stored(): Promise<string[]> {
	const rows = await sequelize.query<{ kind: string; code: string | null; slotKey: string | null }>(
		`SELECT a.kind, r.code, a.slot_key AS slotKey FROM guide_upkeep_alerts a
		   LEFT JOIN regions r ON r.id = a.region_id WHERE a.guide_id = :id`,
		{ type: QueryTypes.SELECT, replacements: { id: g.guide.id } }
	);
	return rows.map((r) => `${r.kind} ${r.code ?? '-'} ${r.slotKey ?? '-'}`).sort();
}

beforeEach(async () => {
	await resetDatabase();
	await seedDemoCommunity(sequelize);
	editorId = (await User.findOne({ where: { email: 'editor@slotwise.test' } }))!.id;
	g = await upkeepGuide(45000, async ({ cpuA, cpuB, gpu }) => {
		await quoteAt(cpuA, 'us', 10000, 1);
		await quoteAt(cpuB, 'us', 12000, 1);
		await quoteAt(gpu, 'us', 30000, 40);
	});
});

describe('upkeep alerts', () => {
	it('flags a pick whose newest quote is older than 30 days (common practice, no published source)', async () => {
		// The card's only quote is 40 days old; 40 > 30. Nothing else holds: $400.00 ≤ $450.00,
		// the alternate ($120.00) is dearer than the pick ($100.00).
		expect(await stored()).toEqual(['stale_quote us gpu-main']);
		const [alert] = await upkeep.openAlerts(g.author.id);
		expect(alert).toMatchObject({
			kind: 'stale_quote',
			severity: 'caution',
			regionCode: 'us',
			editorHref: '/my/guides/upkeep-test-rig/edit#slot-gpu-main'
		});
		expect(alert?.sentence).toContain('no quote newer than 30 days in us');
	});

	it('flags a drop-in alternate that became cheaper than the pick, and not a dearer one', async () => {
		// CPU pick now $130.00 > alternate $120.00. Total $430.00: +7.5 % (30/400), under 10 %.
		await addQuote('tollan-k6-test', 'us', '130.00');
		expect(await stored()).toEqual(['cheaper_dropin us cpu-main', 'stale_quote us gpu-main']);
		const cheaper = (await upkeep.openAlerts(g.author.id)).find((a) => a.kind === 'cheaper_dropin');
		expect(cheaper?.sentence).toBe(
			'Tollan K6 Lite Test is now cheaper than the pick Tollan K6 Test in us (US$120.00 against US$130.00) and fits as a drop-in.'
		);
	});

	it('flags a total that moved more than 10 % and a total over the target budget', async () => {
		// Card now $360.00 (fresh): total $460.00 = +15 % of $400.00; above the $450.00 budget.
		await addQuote('tollan-g8-test', 'us', '360.00');
		expect(await stored()).toEqual(['over_budget us -', 'total_moved us -']);
		const open = await upkeep.openAlerts(g.author.id);
		// Worst first: the budget (conflict) before the move (caution).
		expect(open.map((a) => [a.kind, a.severity])).toEqual([
			['over_budget', 'conflict'],
			['total_moved', 'caution']
		]);
		expect(open[1]?.sentence).toBe(
			'The total in us moved +15 % since publication: US$400.00 then, US$460.00 now.'
		);
		expect(open[0]?.editorHref).toBe('/my/guides/upkeep-test-rig/edit');
	});

	it('holds another region to the budget the guide page shows there, at the reference rate', async () => {
		// The guide page converts the $450.00 budget at the reference rate (the demo's ECB rate
		// of 2 Jan 2024, 1.0956 USD per euro, docs/sources.md 10): 450 ÷ 1.0956 = 410.7338…
		// → €410.73. De had no prices at publication; quoted later at €100.00 + €320.00 before
		// tax, its total with Germany's 19 % VAT (docs/sources.md 11) is 420.00 × 1.19 =
		// €499.80: over that budget.
		await FxRate.create({
			currency: 'USD',
			ratePerEur: '1.0956',
			asOf: '2024-01-02',
			source: 'ECB'
		});
		await addQuote('tollan-k6-test', 'de', '100.00');
		await addQuote('tollan-g8-test', 'de', '320.00');
		expect(await stored()).toEqual(['over_budget de -', 'stale_quote us gpu-main']);
		const open = await upkeep.openAlerts(g.author.id);
		expect(open.find((a) => a.kind === 'over_budget')?.sentence).toBe(
			"The total in de is €499.80, above the guide's target budget of €410.73."
		);
	});

	it("follows the author's own threshold, and refuses one outside 1–50 % with a field message", async () => {
		// Card now $360.00: total $460.00 = +15 % of $400.00 (as above). With 20 % chosen it is
		// no move worth an alert; with 12 % it is. The budget ($450.00) is crossed either way.
		await addQuote('tollan-g8-test', 'us', '360.00');
		expect(await upkeep.setMoveThreshold(g.author.id, { percent: 20 })).toEqual({
			kind: 'ok',
			percent: 20
		});
		expect(await stored()).toEqual(['over_budget us -']);
		await upkeep.setMoveThreshold(g.author.id, { percent: 12 });
		expect(await stored()).toEqual(['over_budget us -', 'total_moved us -']);

		for (const percent of [0, 51, 'ten', 12.5]) {
			const refused = await upkeep.setMoveThreshold(g.author.id, { percent });
			expect(refused).toEqual({
				kind: 'invalid',
				issues: { percent: ['Enter a whole percentage from 1 to 50.'] }
			});
		}
		expect(await upkeep.moveThresholdPercent(g.author.id)).toBe(12);
	});

	it('does not flag a move of exactly 10 % (more than the threshold is needed)', async () => {
		// Card $340.00: total $440.00 = +10 % exactly, and under the $450.00 budget.
		await addQuote('tollan-g8-test', 'us', '340.00');
		expect(await stored()).toEqual([]);
	});

	it('flags a pick with no active quote in a region the guide lists', async () => {
		// A quote for the CPU in de makes de a listed region; the card has none there.
		await addQuote('tollan-k6-test', 'de', '99.00');
		expect(await stored()).toEqual(['no_quote de gpu-main', 'stale_quote us gpu-main']);
		const alert = (await upkeep.openAlerts(g.author.id)).find((a) => a.kind === 'no_quote');
		expect(alert?.sentence).toBe(
			'Tollan G8 Test (Graphics card) has never been quoted in de: readers there cannot price it.'
		);
	});

	it('a pick whose last quote an editor withdraws is gone from the stores there', async () => {
		const quote = (await Quote.findOne({ where: { partId: g.parts.gpu.id } }))!;
		expect(await catalogStores.withdrawQuote(editorId, { quoteId: String(quote.id) })).toEqual({
			kind: 'ok'
		});
		// No active quote for the card in us: no total there, so no move or budget alert, and
		// its stale quote no longer counts.
		expect(await stored()).toEqual(['no_quote us gpu-main']);
		const alert = (await upkeep.openAlerts(g.author.id))[0];
		expect(alert?.sentence).toBe(
			'Tollan G8 Test (Graphics card) has no active quote in us: it may be gone from the stores there.'
		);
		// Again: nothing changes. Unknown or malformed ids are answered, never thrown.
		expect(await catalogStores.withdrawQuote(editorId, { quoteId: String(quote.id) })).toEqual({
			kind: 'ok'
		});
		expect(await catalogStores.withdrawQuote(editorId, { quoteId: '999999' })).toEqual({
			kind: 'not_found'
		});
		expect(await catalogStores.withdrawQuote(editorId, { quoteId: 'x' })).toMatchObject({
			kind: 'invalid'
		});
	});

	it('flags a pairing caution added after publication, and forgets it when the rule goes', async () => {
		const created = await cautions.createRule(editorId, {
			title: 'Test pairing of G8 and six cores',
			message: 'A test caution for this pairing: read the manuals before you build.',
			active: true,
			conditions: [
				{ category: 'gpu', field: 'chip', operator: 'eq', value: 'Auric A52' },
				{ category: 'cpu', field: 'cores', operator: 'eq', value: '6' }
			]
		});
		expect(created.kind).toBe('ok');
		// The alerts follow a rule change after the editor's answer (guide-prices refreshAllLater).
		await settled();
		const lines = await stored();
		expect(lines.filter((l) => l.startsWith('new_finding'))).toHaveLength(1);
		const finding = (await upkeep.openAlerts(g.author.id)).find((a) => a.kind === 'new_finding');
		expect(finding?.sentence).toContain('A test caution for this pairing');
		if (created.kind !== 'ok') return;
		await cautions.deleteRule(editorId, created.rule.id, created.rule.version);
		await settled();
		expect(await stored()).toEqual(['stale_quote us gpu-main']);
	});

	it('snoozes and marks handled for the author only; the marks survive recomputation', async () => {
		await addQuote('tollan-k6-test', 'us', '130.00');
		const open = await upkeep.openAlerts(g.author.id);
		expect(open).toHaveLength(2);
		const [first, second] = open;
		const other = (await User.findOne({ where: { email: 'mira.falkenberg@slotwise.test' } }))!;
		expect(await upkeep.snoozeAlert(other.id, { alertId: first!.id, days: 7 })).toEqual({
			kind: 'not_found'
		});
		expect(await upkeep.snoozeAlert(g.author.id, { alertId: first!.id, days: 3 })).toMatchObject({
			kind: 'invalid',
			issues: { days: ['Snooze for 7 or 30 days.'] }
		});
		expect(await upkeep.snoozeAlert(g.author.id, { alertId: first!.id, days: 7 })).toEqual({
			kind: 'ok'
		});
		expect(await upkeep.markHandled(g.author.id, { alertId: second!.id })).toEqual({ kind: 'ok' });
		// Another quote recomputes the alerts; both conditions still hold, both stay hidden.
		await addQuote('tollan-k6-lite-test', 'us', '119.00');
		expect(await stored()).toHaveLength(2);
		expect(await upkeep.openAlerts(g.author.id)).toEqual([]);
		// Eight days on the snooze is over.
		const later = new Date(Date.now() + 8 * DAY_MS);
		expect((await upkeep.openAlerts(g.author.id, later)).map((a) => a.id)).toEqual([first!.id]);
	});

	it('lists what was set aside and brings it back, for the author only', async () => {
		await addQuote('tollan-k6-test', 'us', '130.00');
		const [first, second] = await upkeep.openAlerts(g.author.id);
		// A whole second: MariaDB keeps DATETIME to the second.
		const now = new Date(Math.floor(Date.now() / 1000) * 1000);
		await upkeep.snoozeAlert(g.author.id, { alertId: first!.id, days: 30 }, now);
		await upkeep.markHandled(g.author.id, { alertId: second!.id });
		const aside = await upkeep.setAsideAlerts(g.author.id);
		// 30 days after the snooze: 30 × 86 400 000 ms later.
		expect(aside.map((a) => [a.id, a.handled, a.snoozedUntil])).toEqual([
			[first!.id, false, new Date(now.getTime() + 30 * DAY_MS).toISOString()],
			[second!.id, true, null]
		]);
		const other = (await User.findOne({ where: { email: 'mira.falkenberg@slotwise.test' } }))!;
		expect(await upkeep.bringBack(other.id, { alertId: first!.id })).toEqual({
			kind: 'not_found'
		});
		expect(await upkeep.bringBack(g.author.id, { alertId: 'x' })).toMatchObject({
			kind: 'invalid'
		});
		expect(await upkeep.bringBack(g.author.id, { alertId: first!.id })).toEqual({ kind: 'ok' });
		expect((await upkeep.openAlerts(g.author.id)).map((a) => a.id)).toEqual([first!.id]);
		expect((await upkeep.setAsideAlerts(g.author.id)).map((a) => a.id)).toEqual([second!.id]);
	});
});

describe('weekly upkeep digest', () => {
	it('is off by default and lists the new alerts worst first when composed', async () => {
		expect((await User.findByPk(g.author.id))?.upkeepDigest).toBe(false);
		await addQuote('tollan-g8-test', 'us', '360.00');
		const message = composeDigest(
			{ name: 'Priya' },
			await upkeep.openAlerts(g.author.id),
			'https://slotwise.example'
		);
		expect(message?.subject).toBe('Your guides this week: upkeep alerts');
		expect(message?.text).toContain(
			"2 new upkeep alerts on your guides since your last digest:\n\n✕ conflict · Upkeep test rig: The total in us is US$460.00, above the guide's target budget of US$450.00.\n△ caution · Upkeep test rig: The total in us moved +15 % since publication"
		);
		expect(composeDigest({ name: null }, [], 'https://slotwise.example')).toBeNull();
	});
});
