import { describe, expect, it } from 'vitest';
import { upkeepAlerts, type UpkeepRegion } from '../../../src/lib/domain/upkeep';

/*
 * The alert conditions of domain/upkeep.ts on hand-made figures (issue 19): moved more than
 * 10 % (the default), a quote older than 30 days (common practice, no published
 * source), no active quote, a cheaper drop-in, a new finding.
 */
const usd = (amountMinor: number) => ({ amountMinor, currency: 'USD' });
const NOW = new Date('2026-12-01T12:00:00Z');

function region(over: Partial<UpkeepRegion> = {}): UpkeepRegion {
	return {
		regionId: 1,
		code: 'us',
		listed: true,
		total: usd(40000),
		totalAtPublication: usd(40000),
		budget: usd(45000),
		cheaperAtPublication: new Set(),
		slots: [
			{
				slotKey: 'cpu',
				label: 'CPU',
				pick: { partId: 1, name: 'Tollan K6', unit: usd(10000) },
				alternates: [{ partId: 2, name: 'Tollan K6 Lite', unit: usd(12000) }]
			}
		],
		latestActiveQuote: new Map([[1, new Date('2026-11-30T00:00:00Z')]]),
		...over
	};
}

const kinds = (r: UpkeepRegion, extra: Partial<Parameters<typeof upkeepAlerts>[0]> = {}) =>
	upkeepAlerts({
		regions: [r],
		dropInFits: new Set(['cpu|2']),
		findings: [],
		findingsAtPublication: new Set(),
		now: NOW,
		...extra
	}).map((a) => a.kind);

describe('upkeep alert conditions', () => {
	it('nothing on an unchanged guide', () => {
		expect(kinds(region())).toEqual([]);
	});

	it('a total 10.0025 % up moves, 10 % does not', () => {
		// 40000 × 1.10 = 44000; 44001 is 10.0025 %.
		expect(kinds(region({ total: usd(44000) }))).toEqual([]);
		expect(kinds(region({ total: usd(44001) }))).toEqual(['total_moved']);
		// Down counts too: 35999 is −10.0025 %.
		expect(kinds(region({ total: usd(35999) }))).toEqual(['total_moved']);
	});

	it('over the budget only when strictly above it', () => {
		expect(kinds(region({ total: usd(45000), totalAtPublication: usd(45000) }))).toEqual([]);
		expect(kinds(region({ total: usd(45001), totalAtPublication: usd(45001) }))).toEqual([
			'over_budget'
		]);
	});

	it('a quote 31 days old is stale, 30 days is not; none at all is no_quote', () => {
		const at = (iso: string) => region({ latestActiveQuote: new Map([[1, new Date(iso)]]) });
		// November has 30 days: 1 Nov → 1 Dec is 30 days, 31 Oct → 1 Dec is 31.
		expect(kinds(at('2026-11-01T12:00:00Z'))).toEqual([]);
		expect(kinds(at('2026-10-31T12:00:00Z'))).toEqual(['stale_quote']);
		expect(kinds(region({ latestActiveQuote: new Map() }))).toEqual(['no_quote']);
	});

	it('a quote 30 days and one hour old is older than 30 days, so stale', () => {
		// 31 Oct 11:00 → 1 Dec 12:00 is 31 days and 1 hour; 1 Nov 11:00 → 1 Dec 12:00 is 30
		// days and 1 hour: no longer "newer than 30 days", though a count of whole days says 30.
		const at = (iso: string) => region({ latestActiveQuote: new Map([[1, new Date(iso)]]) });
		expect(kinds(at('2026-11-01T11:00:00Z'))).toEqual(['stale_quote']);
		expect(kinds(at('2026-11-01T12:00:00Z'))).toEqual([]);
	});

	it('a cheaper alternate only when it fits as a drop-in', () => {
		const cheaper = region();
		cheaper.slots[0]!.alternates[0]!.unit = usd(9999);
		expect(kinds(cheaper)).toEqual(['cheaper_dropin']);
		expect(kinds(cheaper, { dropInFits: new Set() })).toEqual([]);
		// Already the cheaper choice at publication: no news.
		expect(kinds({ ...cheaper, cheaperAtPublication: new Set(['cpu|2']) })).toEqual([]);
	});

	it('a finding not there at publication, conflicts first; an unlisted region is skipped', () => {
		const finding = {
			key: 'rule|cpu',
			rule: 'rule',
			severity: 'caution' as const,
			message: 'm',
			slotKeys: ['cpu']
		};
		expect(kinds(region({ total: usd(50000) }), { findings: [finding] })).toEqual([
			'over_budget',
			'new_finding',
			'total_moved'
		]);
		expect(
			kinds(region(), { findings: [finding], findingsAtPublication: new Set(['rule|cpu']) })
		).toEqual([]);
		expect(kinds(region({ listed: false, latestActiveQuote: new Map() }))).toEqual([]);
	});
});
