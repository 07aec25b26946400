/*
 * The catalog's price sort key, frozen here for the migrations that store it in
 * part_region_prices (the procedure, the regions trigger and the backfill share it): a
 * part's quote in minor units put into its region's tax convention, so a pre-tax quote in a
 * tax-inclusive region sorts by its amount with tax and the other way round. The arithmetic
 * is the one the catalog computed per request before the key was stored, so the order is
 * unchanged: integer columns divided in MariaDB give a DECIMAL rounded to four places
 * (div_precision_increment), which part_region_prices.price_key keeps exactly.
 * Kept in the migrations so later code cannot change what an old migration does; a new
 * key is a new migration with its own copy.
 */

/**
 * The key of quote alias `q` in a region whose tax mode and rate are the SQL expressions
 * `taxMode` and `taxRateBp` (a joined regions row, or a trigger's NEW row).
 */
export function priceKeySql(q: string, taxMode: string, taxRateBp: string): string {
	const wantsTax = `(${taxMode} = 'inclusive')`;
	return `CASE
	    WHEN ${q}.tax_included = ${wantsTax} OR ${taxRateBp} = 0 THEN ${q}.amount_minor
	    WHEN ${wantsTax} THEN ${q}.amount_minor * (10000 + ${taxRateBp}) / 10000
	    ELSE ${q}.amount_minor * 10000 / (10000 + ${taxRateBp}) END`;
}
