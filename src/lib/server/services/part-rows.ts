/*
 * The rows of a parts catalog search in its two orders, as SQL over the parts matching a
 * search's WHERE (services/parts.ts builds it): by brand and model, or by price in one
 * region. Paging happens in the database for both; the spec-filtered path reads every
 * matching row in order and pages in JS.
 *
 * The price order reads part_region_prices, each part's stored sort key per region (its
 * latest active quote put into the region's tax convention, kept by triggers; see the
 * 2026.12.15 migrations): the priced parts by (price_key, brand, model, id) through the
 * (region_id, category, price_key, part_id) or (region_id, price_key, part_id) index, then
 * the parts without a key there by brand and model. Working the key out per part on every
 * request cost a quotes subquery for each matching part before ORDER BY and LIMIT.
 */
import { QueryTypes } from 'sequelize';
import type { PartCategory } from '$lib/domain/types';
import { sequelize } from '$lib/server/db';

export interface SearchRow {
	id: number;
	slug: string;
	category: PartCategory;
	brand: string;
	model: string;
	specs: Record<string, unknown> | string;
}

/** What a search matches: its category and its text condition on parts `p`. */
export interface SearchMatch {
	category: PartCategory | undefined;
	text: { where: string; replacements: Record<string, unknown> } | null;
}

/** A search's rows in one order: how many, one page of them, or all of them. */
export interface RowSource {
	count(): Promise<number>;
	page(offset: number, limit: number): Promise<SearchRow[]>;
	all(): Promise<SearchRow[]>;
}

const COLUMNS = 'p.id, p.slug, p.category, p.brand, p.model, p.specs';
// The id tie-break keeps pages stable.
const NAME_ORDER = 'p.brand ASC, p.model ASC, p.id ASC';

/** The WHERE on parts `p` alone: category (the (category, brand, model, id) index) and text. */
function partsWhere(match: SearchMatch) {
	const conditions = match.text ? [match.text.where] : [];
	if (match.category) conditions.unshift('p.category = :category');
	return {
		where: conditions.length > 0 ? conditions.join(' AND ') : '1 = 1',
		replacements: {
			...match.text?.replacements,
			...(match.category ? { category: match.category } : {})
		}
	};
}

async function select(sql: string, replacements: Record<string, unknown>): Promise<SearchRow[]> {
	return sequelize.query<SearchRow>(sql, { type: QueryTypes.SELECT, replacements });
}

async function countOf(sql: string, replacements: Record<string, unknown>): Promise<number> {
	const [row] = await sequelize.query<{ n: number }>(sql, {
		type: QueryTypes.SELECT,
		replacements
	});
	return Number(row?.n ?? 0);
}

/** By brand and model: walks (brand, model, id) or (category, brand, model, id). */
export function byName(match: SearchMatch): RowSource {
	const { where, replacements } = partsWhere(match);
	const sql = `SELECT ${COLUMNS} FROM parts p WHERE ${where} ORDER BY ${NAME_ORDER}`;
	return {
		count: () => countOf(`SELECT COUNT(*) AS n FROM parts p WHERE ${where}`, replacements),
		page: (offset, limit) =>
			select(`${sql} LIMIT :limit OFFSET :offset`, { ...replacements, limit, offset }),
		all: () => select(sql, replacements)
	};
}

/**
 * By price in region `regionId`, lowest first, parts without a price there last; equal
 * prices by brand and model. The priced parts are walked from part_region_prices in index
 * order (its category copy keeps a category page inside one range) and joined to parts by
 * key; the unpriced ones walk the parts indexes of the name order, each checked against
 * part_region_prices by its primary key.
 */
export function byPrice(match: SearchMatch, regionId: number): RowSource {
	const parts = partsWhere(match);
	const priced = [
		'pp.region_id = :regionId',
		...(match.category ? ['pp.category = :category'] : []),
		...(match.text ? [match.text.where] : [])
	].join(' AND ');
	const replacements = { ...parts.replacements, regionId };
	// Without text nothing of parts is read to count the priced ones: the index range answers.
	const pricedFrom = match.text
		? `FROM part_region_prices pp JOIN parts p ON p.id = pp.part_id WHERE ${priced}`
		: `FROM part_region_prices pp WHERE ${priced}`;
	// The order is all in the index (brand and model are copies of the part's, the id is p.id).
	// Without search words the walk must start at part_region_prices, in index order, and stop
	// at LIMIT. At 100,000 parts, with nine in ten priced in the region, MariaDB otherwise chose
	// to read all of parts and sort the join (0.3 s against 1 ms; EXPLAIN in the spec). With
	// words, the full-text index on parts finds the few matches first, which is the better start.
	const joinOrder = match.text ? '' : 'STRAIGHT_JOIN ';
	const pricedSql = `SELECT ${joinOrder}${COLUMNS} FROM part_region_prices pp JOIN parts p ON p.id = pp.part_id
		WHERE ${priced} ORDER BY pp.price_key ASC, pp.brand ASC, pp.model ASC, pp.part_id ASC`;
	// An outer join rather than NOT EXISTS: MariaDB would materialise the region's whole key set.
	const unpricedSql = `SELECT ${COLUMNS} FROM parts p
		LEFT JOIN part_region_prices pp ON pp.part_id = p.id AND pp.region_id = :regionId
		WHERE ${parts.where} AND pp.part_id IS NULL ORDER BY ${NAME_ORDER}`;
	const limited = (sql: string, offset: number, limit: number) =>
		select(`${sql} LIMIT :limit OFFSET :offset`, { ...replacements, limit, offset });
	return {
		count: () => countOf(`SELECT COUNT(*) AS n FROM parts p WHERE ${parts.where}`, replacements),
		async page(offset, limit) {
			const pricedCount = await countOf(`SELECT COUNT(*) AS n ${pricedFrom}`, replacements);
			const rows = offset < pricedCount ? await limited(pricedSql, offset, limit) : [];
			if (rows.length === limit) return rows;
			const rest = await limited(
				unpricedSql,
				Math.max(0, offset - pricedCount),
				limit - rows.length
			);
			return [...rows, ...rest];
		},
		async all() {
			return [
				...(await select(pricedSql, replacements)),
				...(await select(unpricedSql, replacements))
			];
		}
	};
}
