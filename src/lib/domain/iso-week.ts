/**
 * ISO 8601 week dates, in UTC: weeks start on Monday and week 1 is the week that holds the
 * year's first Thursday, so the last days of December can belong to week 1 of the next year
 * and the first days of January to week 52 or 53 of the last. The weekly upkeep digest is
 * keyed by this week (one per author and week); the daily pass by the UTC day.
 */

const DAY_MS = 86_400_000;

/** "2026-W51": the ISO week-numbering year and week of the instant, in UTC. */
export function isoWeek(at: Date): string {
	const day = Date.UTC(at.getUTCFullYear(), at.getUTCMonth(), at.getUTCDate());
	const weekday = new Date(day).getUTCDay() || 7; // Monday 1 … Sunday 7
	// The Thursday of the same week decides the year.
	const thursday = new Date(day + (4 - weekday) * DAY_MS);
	const year = thursday.getUTCFullYear();
	const week = Math.floor((thursday.getTime() - Date.UTC(year, 0, 1)) / DAY_MS / 7) + 1;
	return `${year}-W${String(week).padStart(2, '0')}`;
}

/** "2026-12-14": the UTC calendar day of the instant. */
export function utcDay(at: Date): string {
	return at.toISOString().slice(0, 10);
}
