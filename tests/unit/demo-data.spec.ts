import { describe, it, expect } from 'vitest';
import { SPEC_SCHEMAS } from '../../src/lib/schemas/part-specs';
import type {
	CaseSpecs,
	CoolerSpecs,
	CpuSpecs,
	GpuSpecs,
	MemorySpecs,
	MotherboardSpecs,
	PsuSpecs,
	StorageSpecs
} from '../../src/lib/schemas/part-specs';
import type { BuildPart } from '../../src/lib/domain/build-parts';
import { fitReport } from '../../src/lib/domain/fit';
import {
	ALTERNATE_REASONS,
	PART_CATEGORIES,
	ROLES,
	type PartCategory
} from '../../src/lib/domain/types';
import {
	demoGuides,
	demoParts,
	demoQuotes,
	demoRegions,
	demoStores,
	demoUsers,
	type DemoGuide,
	type DemoPart
} from '../../src/lib/server/db/seeders/demo-data/index';

/*
 * The demo data is invented, so nothing outside the project can vouch for it; what can
 * be checked is that it is internally consistent and honours the spec contract, so the
 * seeded demo never shows a pick that contradicts the product's own fit rules.
 */

const CORE_CATEGORIES: PartCategory[] = [
	'cpu',
	'cooler',
	'motherboard',
	'memory',
	'storage',
	'gpu',
	'psu',
	'case'
];
const ALLOWED_TAGS = [
	'1080p',
	'1440p',
	'4k',
	'gaming',
	'creator',
	'quiet',
	'compact',
	'budget',
	'atx',
	'mini-itx',
	'microatx'
];
const KEBAB = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;

// Real brands and product lines of the trade; the demo must name none of them.
const REAL_NAMES = [
	'amd',
	'intel',
	'nvidia',
	'geforce',
	'radeon',
	'ryzen',
	'threadripper',
	'epyc',
	'xeon',
	'pentium',
	'celeron',
	'corsair',
	'samsung',
	'asus',
	'asrock',
	'msi',
	'gigabyte',
	'aorus',
	'evga',
	'zotac',
	'palit',
	'powercolor',
	'noctua',
	'seasonic',
	'crucial',
	'kingston',
	'western digital',
	'seagate',
	'sabrent',
	'sk hynix',
	'hynix',
	'g\\.skill',
	'teamgroup',
	'fractal',
	'nzxt',
	'lian li',
	'be quiet',
	'phanteks',
	'thermaltake',
	'cooler master',
	'deepcool',
	'thermalright',
	'windows',
	'ubuntu',
	'macos',
	'freesync',
	'g-sync'
];

const partsBySlug = new Map(demoParts.map((p) => [p.slug, p]));
const storesByName = new Map(demoStores.map((s) => [s.name, s]));
const regionCodes = new Set(demoRegions.map((r) => r.code));

function picksOf(guide: DemoGuide, category: PartCategory): DemoPart[] {
	return guide.slots
		.filter((s) => s.category === category)
		.map((s) => partsBySlug.get(s.pickSlug)!);
}

function onlyPick<T>(guide: DemoGuide, category: PartCategory): T {
	const picks = picksOf(guide, category);
	expect(picks, `${guide.slug}: exactly one ${category} pick`).toHaveLength(1);
	return picks[0]!.specs as T;
}

/** Latest quote (smallest daysAgo) of a part at a store. */
function latestQuote(partSlug: string, storeName: string) {
	return demoQuotes
		.filter((q) => q.partSlug === partSlug && q.storeName === storeName)
		.sort((a, b) => a.daysAgo - b.daysAgo)[0];
}

/** AM sockets derive package power as round(tdp × 1.35) (docs/sources.md 8a); LGA parts state it. */
function cpuPackagePower(cpu: CpuSpecs): number {
	return cpu.packagePowerW ?? Math.round((cpu.tdpW * 135) / 100);
}

describe('demo data is internally consistent (invented data, checked against the spec contract)', () => {
	it('has the four role accounts, known roles and unique e-mails', () => {
		const byEmail = new Map(demoUsers.map((u) => [u.email, u.role]));
		expect(byEmail.size).toBe(demoUsers.length);
		expect(byEmail.get('admin@slotwise.test')).toBe('admin');
		expect(byEmail.get('editor@slotwise.test')).toBe('editor');
		expect(byEmail.get('author@slotwise.test')).toBe('author');
		expect(byEmail.get('reader@slotwise.test')).toBe('reader');
		expect(demoUsers.filter((u) => u.role === 'author').length).toBeGreaterThanOrEqual(3);
		for (const u of demoUsers) expect(ROLES).toContain(u.role);
	});

	it('has regions with sane tax settings and modest category factors', () => {
		expect(regionCodes.size).toBe(demoRegions.length);
		for (const r of demoRegions) {
			expect(r.code).toMatch(/^[a-z]{2}$/);
			expect(r.currency).toMatch(/^[A-Z]{3}$/);
			expect(Number.isInteger(r.taxRateBp)).toBe(true);
			if (r.taxMode === 'exclusive') expect(r.taxRateBp).toBe(0);
			for (const [category, factor] of Object.entries(r.categoryFactorsBp)) {
				expect(PART_CATEGORIES).toContain(category);
				expect(factor).toBeGreaterThanOrEqual(9000);
				expect(factor).toBeLessThanOrEqual(11500);
			}
		}
	});

	it('has uniquely named stores on .example domains in known regions, at least one per region', () => {
		expect(storesByName.size).toBe(demoStores.length);
		for (const s of demoStores) {
			expect(regionCodes.has(s.regionCode), s.name).toBe(true);
			expect(new URL(s.url).protocol).toBe('https:');
			expect(new URL(s.url).hostname.endsWith('.example'), s.url).toBe(true);
		}
		for (const code of regionCodes)
			expect(
				demoStores.some((s) => s.regionCode === code),
				code
			).toBe(true);
	});

	it('has parts whose specs pass the category schema, with unique kebab-case slugs', () => {
		expect(partsBySlug.size).toBe(demoParts.length);
		for (const part of demoParts) {
			expect(part.slug).toMatch(KEBAB);
			const result = SPEC_SCHEMAS[part.category].safeParse(part.specs);
			expect(result.success, `${part.slug}: ${result.error?.message ?? ''}`).toBe(true);
		}
	});

	it('states package power for every LGA CPU', () => {
		for (const part of demoParts.filter((p) => p.category === 'cpu')) {
			const cpu = part.specs as CpuSpecs;
			if (cpu.socket.startsWith('LGA')) expect(cpu.packagePowerW, part.slug).toBeDefined();
		}
	});

	it('has at least six parts per core category and the smaller categories filled', () => {
		const count = (c: PartCategory) => demoParts.filter((p) => p.category === c).length;
		for (const c of CORE_CATEGORIES) expect(count(c), c).toBeGreaterThanOrEqual(6);
		expect(count('fan')).toBeGreaterThanOrEqual(3);
		expect(count('os')).toBeGreaterThanOrEqual(2);
		expect(count('extra')).toBeGreaterThanOrEqual(2);
	});

	it('has quotes for known parts at known stores, in positive whole minor units', () => {
		for (const q of demoQuotes) {
			expect(partsBySlug.has(q.partSlug), q.partSlug).toBe(true);
			expect(storesByName.has(q.storeName), q.storeName).toBe(true);
			expect(
				Number.isInteger(q.amountMinor) && q.amountMinor > 0,
				`${q.partSlug} ${q.amountMinor}`
			).toBe(true);
			if (q.shippingMinor !== undefined)
				expect(Number.isInteger(q.shippingMinor) && q.shippingMinor >= 0).toBe(true);
			expect(Number.isInteger(q.daysAgo) && q.daysAgo >= 0 && q.daysAgo <= 120).toBe(true);
		}
		// No two observations of one part at one store on the same day.
		const keys = demoQuotes.map((q) => `${q.partSlug}|${q.storeName}|${q.daysAgo}`);
		expect(new Set(keys).size).toBe(keys.length);
	});

	it('gives several parts a price history and leaves some parts unquoted in some region', () => {
		const perStore = new Map<string, number>();
		for (const q of demoQuotes)
			perStore.set(
				`${q.partSlug}|${q.storeName}`,
				(perStore.get(`${q.partSlug}|${q.storeName}`) ?? 0) + 1
			);
		expect([...perStore.values()].filter((n) => n >= 3).length).toBeGreaterThanOrEqual(4);

		const quotedIn = (slug: string, region: string) =>
			demoQuotes.some(
				(q) => q.partSlug === slug && storesByName.get(q.storeName)?.regionCode === region
			);
		const gaps = demoParts.filter((p) => [...regionCodes].some((r) => !quotedIn(p.slug, r)));
		expect(gaps.length).toBeGreaterThanOrEqual(3);
	});

	it('has at least three published guides at different budgets and base regions', () => {
		expect(demoGuides.length).toBeGreaterThanOrEqual(3);
		expect(new Set(demoGuides.map((g) => g.slug)).size).toBe(demoGuides.length);
		expect(new Set(demoGuides.map((g) => g.baseRegionCode)).size).toBe(demoGuides.length);
		const authors = new Set(demoUsers.filter((u) => u.role === 'author').map((u) => u.email));
		for (const g of demoGuides) {
			expect(g.slug).toMatch(KEBAB);
			expect(authors.has(g.authorEmail), g.authorEmail).toBe(true);
			expect(regionCodes.has(g.baseRegionCode), g.baseRegionCode).toBe(true);
			expect(Number.isInteger(g.targetBudgetMinor) && g.targetBudgetMinor > 0).toBe(true);
			for (const tag of g.tags) expect(ALLOWED_TAGS, `${g.slug}: ${tag}`).toContain(tag);
		}
	});

	it('has build notes with the four sections and the safety cautions', () => {
		for (const g of demoGuides) {
			const headings = [...g.buildNotesMd.matchAll(/^## (.+)$/gm)].map((m) => m[1]);
			expect(headings, g.slug).toEqual([
				'Firmware setup checklist',
				'Assembly steps',
				'Cable routing',
				'Display pairing'
			]);
			const notes = g.buildNotesMd.toLowerCase();
			for (const phrase of [
				'unplug it from the mains',
				'never open the power supply',
				'12v-2x6',
				'anti-static',
				'sharp',
				'local electrical codes',
				'manual'
			]) {
				expect(notes, `${g.slug}: ${phrase}`).toContain(phrase);
			}
		}
	});

	for (const guide of demoGuides) {
		describe(`guide ${guide.slug}`, () => {
			const baseStores = new Set(
				demoStores.filter((s) => s.regionCode === guide.baseRegionCode).map((s) => s.name)
			);

			it('has at least eight slots, each with a reason and one to three alternates of its category', () => {
				expect(guide.slots.length).toBeGreaterThanOrEqual(8);
				for (const slot of guide.slots) {
					const pick = partsBySlug.get(slot.pickSlug);
					expect(pick, slot.pickSlug).toBeDefined();
					expect(pick!.category).toBe(slot.category);
					expect(slot.reason.trim().length).toBeGreaterThan(20);
					expect(Number.isInteger(slot.quantity) && slot.quantity >= 1).toBe(true);
					expect(slot.alternates.length).toBeGreaterThanOrEqual(1);
					expect(slot.alternates.length).toBeLessThanOrEqual(3);
					const altSlugs = slot.alternates.map((a) => a.partSlug);
					expect(new Set(altSlugs).size).toBe(altSlugs.length);
					expect(altSlugs).not.toContain(slot.pickSlug);
					for (const alt of slot.alternates) {
						const part = partsBySlug.get(alt.partSlug);
						expect(part, alt.partSlug).toBeDefined();
						expect(part!.category, alt.partSlug).toBe(slot.category);
						expect(ALTERNATE_REASONS).toContain(alt.reasonTag);
						expect(alt.note.trim().length).toBeGreaterThan(0);
					}
				}
				for (const c of [
					'cpu',
					'motherboard',
					'memory',
					'storage',
					'gpu',
					'psu',
					'case'
				] as const) {
					expect(picksOf(guide, c).length, c).toBeGreaterThanOrEqual(1);
				}
			});

			it('prices each pick at a base-region store that quotes it, and every alternate in the base region', () => {
				for (const slot of guide.slots) {
					expect(baseStores.has(slot.quoteStore), `${slot.pickSlug} @ ${slot.quoteStore}`).toBe(
						true
					);
					expect(
						latestQuote(slot.pickSlug, slot.quoteStore),
						`${slot.pickSlug} @ ${slot.quoteStore}`
					).toBeDefined();
					for (const alt of slot.alternates) {
						const quoted = demoQuotes.some(
							(q) => q.partSlug === alt.partSlug && baseStores.has(q.storeName)
						);
						expect(quoted, `${alt.partSlug} in ${guide.baseRegionCode}`).toBe(true);
					}
				}
			});

			it('keeps the picks within the target budget', () => {
				const total = guide.slots.reduce(
					(sum, slot) =>
						sum + latestQuote(slot.pickSlug, slot.quoteStore)!.amountMinor * slot.quantity,
					0
				);
				expect(total).toBeLessThanOrEqual(guide.targetBudgetMinor);
				expect(total).toBeGreaterThanOrEqual(guide.targetBudgetMinor * 0.85);
			});

			it('has picks that physically fit together', () => {
				const cpu = onlyPick<CpuSpecs>(guide, 'cpu');
				const board = onlyPick<MotherboardSpecs>(guide, 'motherboard');
				const memory = onlyPick<MemorySpecs>(guide, 'memory');
				const gpu = onlyPick<GpuSpecs>(guide, 'gpu');
				const psu = onlyPick<PsuSpecs>(guide, 'psu');
				const pcCase = onlyPick<CaseSpecs>(guide, 'case');
				const coolers = picksOf(guide, 'cooler').map((p) => p.specs as CoolerSpecs);

				expect(cpu.socket).toBe(board.socket);
				expect(cpu.memoryTypes).toContain(board.memoryType);
				expect(memory.type).toBe(board.memoryType);
				expect(memory.modules).toBeLessThanOrEqual(board.memorySlots);
				expect(memory.modules * memory.moduleGb).toBeLessThanOrEqual(board.maxMemoryGb);
				expect(pcCase.boardFormFactors).toContain(board.formFactor);
				expect(gpu.lengthMm).toBeLessThanOrEqual(pcCase.maxGpuLengthMm);
				expect(pcCase.psuFormFactors).toContain(psu.formFactor);

				if (coolers.length === 0)
					expect(cpu.bundledCooler, 'no cooler slot needs a bundled cooler').toBe(true);
				for (const cooler of coolers) {
					expect(cooler.sockets).toContain(cpu.socket);
					expect(cooler.ratedHeatW).toBeGreaterThanOrEqual(cpuPackagePower(cpu));
					if (cooler.type === 'air')
						expect(cooler.heightMm!).toBeLessThanOrEqual(pcCase.maxCoolerHeightMm);
					if (cooler.type === 'liquid')
						expect(cooler.radiatorMm!).toBeLessThanOrEqual(pcCase.radiatorMm);
				}

				const nvme = picksOf(guide, 'storage').filter(
					(p) => (p.specs as StorageSpecs).interface === 'nvme'
				);
				expect(nvme.length).toBeLessThanOrEqual(board.m2Slots.length);

				// Auxiliary connectors: the PSU must have a lead for every inlet on the card.
				expect(gpu.powerConnectors.h12v2x6).toBeLessThanOrEqual(psu.connectors.h12v2x6);
				expect(gpu.powerConnectors.pin8).toBeLessThanOrEqual(psu.connectors.pin8);
				expect(gpu.powerConnectors.pin6).toBeLessThanOrEqual(
					psu.connectors.pin6 + psu.connectors.pin8
				);

				// Common practice, no published source: keep the load at or below about 70 % of the rating.
				const allowanceW = 100; // board, memory, drives and fans, generously
				const loadW = cpuPackagePower(cpu) + gpu.boardPowerW + allowanceW;
				expect(loadW).toBeLessThanOrEqual(psu.ratedW * 0.7);
			});
		});
	}

	/*
	 * Each guide's fit report, reviewed by hand: no conflict, and exactly these cautions,
	 * each deserved by the invented specs (allowances and the two-thirds threshold: common
	 * practice, no published source; docs/sources.md "PSU sizing threshold").
	 */
	const REVIEWED_CAUTIONS: Record<string, string[]> = {
		'steady-1080p-starter': [],
		// 142 (105 W TDP × 1.35, 8a) + 3 cooler fan + 50 board + 2 × 5 DDR5 + 8 NVMe + 263 card
		// + 3 × 3 case fans + 2 × 3 added fans + 15 USB = 506 W; 506 × 3 = 1518 > 750 × 2 = 1500.
		// The guide lists an 850 W alternate.
		'balanced-1440p-am5': ['psu-rating'],
		// 250 (stated) + 14 (pump 5 + 3 × 3) + 50 + 2 × 5 + 2 × 8 + 300 + 3 × 3 + 3 × 3 + 15
		// = 673 W; 673 × 3 = 2019 > 1000 × 2 = 2000.
		'quiet-4k-play-and-work': ['psu-rating'],
		'pocket-itx-1440p': []
	};

	it('gives each guide a fit report without conflicts and with only the cautions reviewed by hand', () => {
		expect(Object.keys(REVIEWED_CAUTIONS).sort()).toEqual(demoGuides.map((g) => g.slug).sort());
		for (const guide of demoGuides) {
			const build = guide.slots.map((slot, i) => {
				const part = partsBySlug.get(slot.pickSlug)!;
				return {
					key: `slot-${i}`,
					label: slot.label,
					category: slot.category,
					quantity: slot.quantity,
					part: { brand: part.brand, model: part.model, specs: part.specs }
				} as BuildPart;
			});
			const findings = fitReport(build);
			expect(
				findings.filter((f) => f.severity === 'conflict').map((f) => f.message),
				guide.slug
			).toEqual([]);
			expect(
				findings.filter((f) => f.severity === 'caution').map((f) => f.rule),
				guide.slug
			).toEqual(REVIEWED_CAUTIONS[guide.slug]);
		}
	});

	it('names no real brand or product line anywhere in the demo data', () => {
		const text = JSON.stringify({
			demoUsers,
			demoRegions,
			demoStores,
			demoParts,
			demoQuotes,
			demoGuides
		});
		const pattern = new RegExp(`\\b(?:${REAL_NAMES.join('|')})\\b`, 'gi');
		expect(text.match(pattern) ?? []).toEqual([]);
	});
});
