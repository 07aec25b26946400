/*
 * Generates a community of a real site's size on top of the seeded demo community, for
 * `npm run bench:scale`: published guides with two revisions each (slots, ranked alternates,
 * a frame result), parts with specs copied from the demo part of their category, store
 * quotes in every region, and forked builds. Every name is invented from the word lists
 * below; no real product, brand, store or person.
 *
 * Fast on purpose: explicit ids (so rows can point at each other without reading back),
 * multi-row INSERTs of a few thousand rows each, foreign-key and unique checks off for the
 * session. Deterministic: the same scale gives the same rows.
 */
import { randomUUID } from 'node:crypto';
import { QueryTypes } from 'sequelize';
import type { Sequelize } from 'sequelize';
import { minorUnitDigits } from '../../src/lib/domain/money';

export interface ScaleCounts {
	guides: number;
	parts: number;
	quotes: number;
	builds: number;
}

/** The size at SCALE=1; SCALE=0.1 is a tenth of everything. */
export function countsAt(scale: number): ScaleCounts {
	const n = (x: number) => Math.max(1, Math.round(x * scale));
	return { guides: n(10_000), parts: n(100_000), quotes: n(1_000_000), builds: n(100_000) };
}

const BRANDS = (
	'Vantor Kessly Orvel Brannic Tamsel Haldor Corvane Nimbra Quellon Raskel Ostrin Pellar ' +
	'Zundra Mirevo Fennick Yarrowby Lusk Debrant Ivory-Hale Tolsen'
).split(' ');
const MODEL_WORDS = (
	'Strata Ridge Summit Aero Pulse Vector Drift Ember Frost Tide Quill Lumen Nova Cinder ' +
	'Harbor Gale Thorn Basalt Fjord Glint Mesa Onyx Prism Sable Talon Umber Vale Wisp'
).split(' ');
const SUFFIXES = ['', ' Pro', ' Air', ' Mini', ' XT', ' Plus', ' Lite', ' S'];
const TAGS = ['gaming', '1080p', '1440p', '4k', 'quiet', 'itx', 'workstation', 'budget', 'stream'];
const NOTE_WORDS = (
	'seat the cooler evenly before tightening the screws in a cross pattern route the cables ' +
	'behind the tray keep airflow front to back update the firmware first enable the memory ' +
	'profile check the standoffs match the board ground yourself on the case frame'
).split(' ');
const GUIDE_SLOTS = ['cpu', 'cooler', 'motherboard', 'memory', 'storage', 'gpu', 'psu', 'case'];
const SLOT_LABELS: Record<string, string> = {
	cpu: 'Processor',
	cooler: 'CPU cooler',
	motherboard: 'Motherboard',
	memory: 'Memory',
	storage: 'Storage',
	gpu: 'Graphics card',
	psu: 'Power supply',
	case: 'Case'
};
/** A rough shelf price per category in euros, for plausible quotes. */
const EUR_PRICE: Record<string, number> = {
	cpu: 260,
	cooler: 60,
	motherboard: 180,
	memory: 110,
	storage: 90,
	gpu: 520,
	psu: 110,
	case: 95,
	fan: 18,
	os: 120,
	extra: 25
};
/** Rough units of each currency per euro, only to make amounts look right. */
const PER_EUR: Record<string, number> = { EUR: 1, USD: 1.1, GBP: 0.86, JPY: 160, CAD: 1.5 };

/** mulberry32: a small deterministic generator. */
function random(seed: number): () => number {
	let a = seed >>> 0;
	return () => {
		a = (a + 0x6d2b79f5) >>> 0;
		let t = a;
		t = Math.imul(t ^ (t >>> 15), t | 1);
		t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
		return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
	};
}

interface RegionRow {
	id: number;
	code: string;
	currency: string;
	taxMode: string;
}

export async function generate(
	sequelize: Sequelize,
	counts: ScaleCounts,
	log: (line: string) => void
): Promise<void> {
	const rnd = random(20261211);
	const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)] as T;
	const int = (lo: number, hi: number) => lo + Math.floor(rnd() * (hi - lo + 1));
	const q = <T extends object>(sql: string) => sequelize.query<T>(sql, { type: QueryTypes.SELECT });
	const max = async (table: string) =>
		Number((await q<{ n: number }>(`SELECT COALESCE(MAX(id), 0) AS n FROM ${table}`))[0]?.n ?? 0);

	const regions = (
		await q<RegionRow>('SELECT id, code, currency, tax_mode AS taxMode FROM regions')
	).map((r) => ({ ...r, id: Number(r.id) }));
	const stores = await q<{ id: number; regionId: number }>(
		'SELECT id, region_id AS regionId FROM stores'
	);
	const storesOf = new Map<number, number[]>();
	for (const s of stores)
		storesOf.set(Number(s.regionId), [...(storesOf.get(Number(s.regionId)) ?? []), Number(s.id)]);
	const quotedRegions = regions.filter((r) => storesOf.has(r.id));
	const specsOf = new Map<string, string>();
	for (const row of await q<{ category: string; specs: unknown }>(
		'SELECT category, specs FROM parts ORDER BY id'
	))
		if (!specsOf.has(row.category))
			specsOf.set(
				row.category,
				typeof row.specs === 'string' ? row.specs : JSON.stringify(row.specs)
			);
	const categories = [...specsOf.keys()];
	if (regions.length === 0 || quotedRegions.length === 0 || categories.length === 0)
		throw new Error('Seed the demo community first: no regions, stores or parts to start from.');

	const now = new Date();
	const day = 86_400_000;
	const at = (daysAgo: number) => new Date(now.getTime() - daysAgo * day);
	// The caller's instance has a pool of one, so these hold for every insert below.
	const conn = sequelize;
	await conn.query('SET SESSION foreign_key_checks = 0, unique_checks = 0');

	/** Inserts `total` rows made by `row(i)` in chunks of `chunk`. */
	async function insert(
		table: string,
		columns: string[],
		total: number,
		row: (i: number) => unknown[],
		chunk = 2_000
	): Promise<void> {
		const started = performance.now();
		for (let from = 0; from < total; from += chunk) {
			const rows: unknown[][] = [];
			for (let i = from; i < Math.min(total, from + chunk); i++) rows.push(row(i));
			await conn.query(
				`INSERT INTO ${table} (${columns.join(', ')}) VALUES ${rows.map(() => '(?)').join(', ')}`,
				{ replacements: rows, type: QueryTypes.INSERT }
			);
		}
		log(`  ${table}: ${total} rows in ${((performance.now() - started) / 1000).toFixed(1)} s`);
	}

	// Users: authors of the guides and owners of the builds.
	const authors = Array.from({ length: Math.max(10, Math.round(counts.guides / 10)) }, () =>
		randomUUID()
	);
	const readers = Array.from({ length: Math.max(10, Math.round(counts.builds / 20)) }, () =>
		randomUUID()
	);
	await insert(
		'users',
		['id', 'email', 'handle', 'name', 'role', 'email_verified_at', 'created_at', 'updated_at'],
		authors.length + readers.length,
		(i) => {
			const author = i < authors.length;
			const id = author ? authors[i] : readers[i - authors.length];
			// Unique by the running number, as the column requires; the demo's handles are words.
			const handle = author ? `author${i}` : `reader${i}`;
			const email = `${handle}@scale.test`;
			const name = `${pick(MODEL_WORDS)} ${pick(BRANDS)} ${i}`;
			return [id, email, handle, name, author ? 'author' : 'reader', now, now, now];
		}
	);

	// Parts, round the categories; specs as the demo part of the category.
	const partBase = (await max('parts')) + 1;
	const partsOf = new Map<string, number[]>();
	const categoryOf = (i: number) => categories[i % categories.length] as string;
	for (let i = 0; i < counts.parts; i++) {
		const c = categoryOf(i);
		const list = partsOf.get(c) ?? [];
		list.push(partBase + i);
		partsOf.set(c, list);
	}
	await insert(
		'parts',
		['id', 'category', 'brand', 'model', 'slug', 'specs', 'created_at', 'updated_at'],
		counts.parts,
		(i) => {
			const brand = pick(BRANDS);
			const model = `${pick(MODEL_WORDS)} ${int(100, 9999)}${pick(SUFFIXES)}`;
			const slug = `${brand}-${model}-${i}`.toLowerCase().replace(/[^a-z0-9]+/g, '-');
			return [
				partBase + i,
				categoryOf(i),
				brand,
				model,
				slug,
				specsOf.get(categoryOf(i)),
				now,
				now
			];
		}
	);

	// Quotes: each part about quotes/parts times, in random regions with a store there.
	const statusActive = 0.95;
	await insert(
		'quotes',
		[
			'part_id',
			'store_id',
			'region_id',
			'amount_minor',
			'currency',
			'tax_included',
			'shipping_minor',
			'observed_at',
			'url',
			'source',
			'status',
			'created_at',
			'updated_at'
		],
		counts.quotes,
		(i) => {
			const part = partBase + (i % counts.parts);
			const region = pick(quotedRegions);
			const eur = (EUR_PRICE[categoryOf(i % counts.parts)] ?? 50) * (0.7 + rnd() * 0.6);
			const amount = Math.round(
				eur * (PER_EUR[region.currency] ?? 1) * 10 ** minorUnitDigits(region.currency)
			);
			const observed = at(rnd() * 120);
			return [
				part,
				pick(storesOf.get(region.id) ?? []),
				region.id,
				amount,
				region.currency,
				region.taxMode === 'inclusive' ? 1 : 0,
				0,
				observed,
				null,
				'editor',
				rnd() < statusActive ? 'active' : 'withdrawn',
				observed,
				observed
			];
		},
		5_000
	);

	// Guides: published, each with an older and a current revision.
	const guideBase = (await max('guides')) + 1;
	const revisionBase = (await max('guide_revisions')) + 1;
	const revisionOf = (g: number, n: 1 | 2) => revisionBase + g * 2 + (n - 1);
	const guide = Array.from({ length: counts.guides }, (_, g) => {
		const region = pick(regions);
		const words = `${pick(MODEL_WORDS)} ${pick(TAGS)} ${pick(['tower', 'box', 'build', 'rig'])}`;
		return {
			id: guideBase + g,
			title: `${words} ${g}`,
			summary: `A ${pick(TAGS)} build around ${pick(BRANDS)} parts, tuned for ${pick(TAGS)}.`,
			notes: Array.from({ length: 60 }, () => pick(NOTE_WORDS)).join(' '),
			tags: JSON.stringify([...new Set([pick(TAGS), pick(TAGS), pick(TAGS)])]),
			region,
			budget:
				Math.round(int(600, 3000) * (PER_EUR[region.currency] ?? 1)) *
				10 ** minorUnitDigits(region.currency),
			author: pick(authors),
			publishedAt: at(rnd() * 700),
			featured: rnd() < 0.01 ? 1 : 0
		};
	});
	await insert(
		'guides',
		[
			'id',
			'slug',
			'author_id',
			'title',
			'summary',
			'target_budget_minor',
			'base_region_id',
			'tags',
			'featured',
			'state',
			'published_revision_id',
			'version',
			'disclosure',
			'created_at',
			'updated_at'
		],
		counts.guides,
		(g) => {
			const x = guide[g]!;
			return [
				x.id,
				`scale-guide-${g}`,
				x.author,
				x.title,
				x.summary,
				x.budget,
				x.region.id,
				x.tags,
				x.featured,
				'published',
				revisionOf(g, 2),
				2,
				'none',
				x.publishedAt,
				x.publishedAt
			];
		}
	); // Their tags as rows too (the Guide model's hook does this for rows it writes).
	await sequelize.query(
		`INSERT INTO guide_tags (tag, guide_id)
		 SELECT t.tag, g.id FROM guides g,
		        JSON_TABLE(g.tags, '$[*]' COLUMNS (tag VARCHAR(64) PATH '$')) t
		  WHERE g.id >= :guideBase`,
		{ type: QueryTypes.INSERT, replacements: { guideBase } }
	);

	await insert(
		'guide_revisions',
		[
			'id',
			'guide_id',
			'number',
			'title',
			'summary',
			'target_budget_minor',
			'base_region_id',
			'tags',
			'disclosure',
			'build_notes_md',
			'build_notes_html',
			'submitted_at',
			'reviewed_at',
			'published_at',
			'decision',
			'created_at',
			'updated_at'
		],
		counts.guides * 2,
		(i) => {
			const g = Math.floor(i / 2);
			const n = (i % 2) + 1;
			const x = guide[g]!;
			const when = n === 2 ? x.publishedAt : new Date(x.publishedAt.getTime() - 30 * day);
			return [
				revisionOf(g, n as 1 | 2),
				x.id,
				n,
				x.title,
				x.summary,
				x.budget,
				x.region.id,
				x.tags,
				'none',
				x.notes,
				`<p>${x.notes}</p>`,
				when,
				when,
				when,
				'approve',
				when,
				when
			];
		},
		1_000
	);

	// Slots of both revisions: one per guide category, each with two ranked alternates.
	const slotBase = (await max('guide_slots')) + 1;
	const slotsPerRevision = GUIDE_SLOTS.filter((c) => partsOf.has(c));
	const slotCount = counts.guides * 2 * slotsPerRevision.length;
	await insert(
		'guide_slots',
		[
			'id',
			'revision_id',
			'slot_key',
			'category',
			'label',
			'position',
			'quantity',
			'pick_part_id',
			'reason',
			'created_at',
			'updated_at'
		],
		slotCount,
		(i) => {
			const position = i % slotsPerRevision.length;
			const category = slotsPerRevision[position]!;
			const revision = revisionBase + Math.floor(i / slotsPerRevision.length);
			return [
				slotBase + i,
				revision,
				randomUUID(),
				category,
				SLOT_LABELS[category] ?? category,
				position,
				1,
				pick(partsOf.get(category) ?? []),
				'Balanced price and noise for this build.',
				now,
				now
			];
		},
		4_000
	);
	await insert(
		'slot_alternates',
		['slot_id', 'part_id', 'rank', 'reason_tag', 'note', 'created_at', 'updated_at'],
		slotCount * 2,
		(i) => {
			const slot = Math.floor(i / 2);
			const category = slotsPerRevision[slot % slotsPerRevision.length]!;
			return [
				slotBase + slot,
				pick(partsOf.get(category) ?? []),
				(i % 2) + 1,
				pick(['lower_price', 'easier_to_find', 'upgrade_path', 'quieter', 'looks']),
				'',
				now,
				now
			];
		},
		5_000
	);
	await insert(
		'frame_results',
		[
			'revision_id',
			'position',
			'workload',
			'resolution',
			'preset',
			'avg_fps_tenths',
			'low1_fps_tenths',
			'created_at',
			'updated_at'
		],
		counts.guides,
		(g) => [
			revisionOf(g, 2),
			0,
			`${pick(MODEL_WORDS)} Odyssey`,
			'1440p',
			'High',
			int(450, 2200),
			null,
			now,
			now
		]
	);

	// Builds forked from the guides by readers.
	const tokenChars = [...'ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789-_'];
	await insert(
		'builds',
		[
			'owner_id',
			'source_guide_id',
			'base_revision_id',
			'title',
			'region_id',
			'visibility',
			'share_token',
			'notes',
			'notify_on_new_revision',
			'version',
			'created_at',
			'updated_at'
		],
		counts.builds,
		(b) => {
			const g = int(0, counts.guides - 1);
			const token =
				`s${b.toString(36)}-` + Array.from({ length: 43 }, () => pick(tokenChars)).join('');
			return [
				pick(readers),
				guideBase + g,
				revisionOf(g, 2),
				`My copy of ${guide[g]!.title}`,
				pick(regions).id,
				'private',
				token.slice(0, 43),
				'',
				1,
				1,
				now,
				now
			];
		},
		5_000
	);
	await conn.query('SET SESSION foreign_key_checks = 1, unique_checks = 1');
}
