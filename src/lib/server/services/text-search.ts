/*
 * A reader's search words turned into a MariaDB full-text query (MATCH … AGAINST … IN
 * BOOLEAN MODE) that their characters cannot break, plus the words the full-text index
 * cannot answer. Parts search (parts.ts) and guide search (guide-browse.ts) share it.
 *
 * Why the split: InnoDB's full-text index holds only tokens of at least
 * innodb_ft_min_token_size characters (3 by default) that are not on its stopword list, and a
 * required term (`+x2*`, `+the*`) that the index never holds matches nothing at all. So each
 * word the reader typed is sorted:
 *
 * - its tokens long enough and not stopwords become required prefix terms (`+strata*`);
 * - a word with any shorter or stopword token (or with no letters or digits: `%`, `--`) is
 *   kept whole as a "short word", matched with LIKE by the caller: as a substring of the
 *   rows the full-text terms already found (cheap: only those rows are read), or, when the
 *   search has no full-text term at all, as a prefix of an indexed column (a range scan, not
 *   a scan of the table; such a search finds text that begins with the word).
 *
 * Operators of boolean mode (`+ - > < ( ) ~ * " @`) never reach AGAINST: a token is a run of
 * letters, digits and `_` (the characters InnoDB's parser keeps in a word), so whatever else
 * the reader typed only separates tokens.
 */
import { QueryTypes } from 'sequelize';
import { sequelize } from '$lib/server/db';
import { escapeLike } from './list-query';

/** InnoDB's built-in stopword list (INFORMATION_SCHEMA.INNODB_FT_DEFAULT_STOPWORD, MariaDB 10.11). */
const INNODB_STOPWORDS = new Set(
	(
		'a about an are as at be by com de en for from how i in is it la of on or that the this ' +
		'to was what when where who will with und www'
	).split(' ')
);

/** At most this many words of a search count (the schemas cap the text at 100 characters). */
export const MAX_SEARCH_WORDS = 8;

export interface TextSearch {
	/** The AGAINST string (boolean mode), or '' when no word has a token the index holds. */
	against: string;
	/** Words the index cannot answer, as typed (lower-cased), for LIKE; escape them with escapeLike. */
	shortWords: string[];
}

/** Splits `text` for a full-text index whose shortest token is `minTokenSize` characters. */
export function textSearch(text: string, minTokenSize: number): TextSearch {
	const words = text.toLowerCase().trim().split(/\s+/).filter(Boolean).slice(0, MAX_SEARCH_WORDS);
	const terms = new Set<string>();
	const shortWords: string[] = [];
	for (const word of words) {
		const tokens = word.match(/[\p{L}\p{N}_]+/gu) ?? [];
		const indexed = (t: string) => [...t].length >= minTokenSize && !INNODB_STOPWORDS.has(t);
		for (const token of tokens.filter(indexed)) terms.add(`+${token}*`);
		if (tokens.length === 0 || !tokens.every(indexed)) shortWords.push(word);
	}
	return { against: [...terms].join(' '), shortWords };
}

let minTokenSize: Promise<number> | null = null;

/** The server's innodb_ft_min_token_size (read once per process; it needs a restart to change). */
export function ftMinTokenSize(): Promise<number> {
	minTokenSize ??= sequelize
		.query<{ n: number }>('SELECT @@innodb_ft_min_token_size AS n', { type: QueryTypes.SELECT })
		.then((rows) => Number(rows[0]?.n ?? 3));
	minTokenSize.catch(() => (minTokenSize = null));
	return minTokenSize;
}

/** `%word%` for LIKE, the word's wildcards taken literally. */
export const containsPattern = (word: string) => `%${escapeLike(word)}%`;
/** `word%` for LIKE (an index range), the word's wildcards taken literally. */
export const prefixPattern = (word: string) => `${escapeLike(word)}%`;
