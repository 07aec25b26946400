import { z } from 'zod';
// Relative, so scripts run with tsx can load schemas too.
import { looksLikeAmount } from '../domain/money.js';

/*
 * The building blocks every input schema shares, so a value means the same thing in every
 * form and every JSON body: amounts, calendar dates, versions, ids, slugs, region codes.
 *
 * Schemas describe the JSON shape (numbers are numbers). A form posts text, so its reader
 * (schemas/form-data.ts) turns text into that shape first, with the one rule below for
 * whole numbers, and then parses with the same schema: a bad value gets the same message
 * whichever way it came.
 */

// ---------------------------------------------------------------------------------------------
// Whole numbers from text
// ---------------------------------------------------------------------------------------------

const DIGITS = /^[0-9]{1,15}$/;

/**
 * Form text → number, for a field the schema wants as a whole number. Only ASCII digits
 * count: "0x10", "1.8e1", " 5", "+5", "5.0" and "" stay text, and the schema refuses them
 * with its own message (`Number()` would have read 16, 18, 5, 5, 5 and 0). Leading zeros are
 * read as decimal, never octal ("05" → 5): number inputs post what the person typed.
 * Anything that is not a string passes through unchanged.
 */
export function wholeNumberFromText(value: unknown): unknown {
	return typeof value === 'string' && DIGITS.test(value) ? Number(value) : value;
}

/** A whole number in [min, max] from JSON, with one message for every way it can be wrong. */
export function wholeNumber(message: string, min = 0, max = Number.MAX_SAFE_INTEGER) {
	return z.number({ error: message }).int(message).min(min, message).max(max, message);
}

/** The same, for schemas that only forms post (a URL's query, an editor's form): digits only. */
export function wholeNumberText(message: string, min = 0, max = Number.MAX_SAFE_INTEGER) {
	return z.preprocess(wholeNumberFromText, wholeNumber(message, min, max));
}

/** Largest id a row can have (INTEGER UNSIGNED). */
export const MAX_ID = 2 ** 32 - 1;

/** A row id chosen from a list: `Choose a part.` for every wrong value. */
export const id = (what: string) => wholeNumber(`Choose a ${what}.`, 1, MAX_ID);

export const VERSION_MESSAGE = 'Send the version you last saw (reload to get it).';

/**
 * The version a change was made against (optimistic locking). Only the app writes it, so
 * a bad one means a broken or stale page; the message says to reload.
 */
export const version = wholeNumber(VERSION_MESSAGE, 1, 2 ** 31 - 1);

// ---------------------------------------------------------------------------------------------
// Text
// ---------------------------------------------------------------------------------------------

export const SLUG_PATTERN = /^[a-z0-9]+(?:-[a-z0-9]+)*$/;
export const SLUG_MAX = 140;

/** A stored slug (guides, parts): lower-case kebab case, as the [slug=slug] matcher takes. */
export const slug = (message: string) =>
	z.string({ error: message }).max(SLUG_MAX, message).regex(SLUG_PATTERN, message);

/** A region code as stored: 2–8 letters, lower case ("de", "us"). */
export const regionCode = (message = 'Choose a region.') =>
	z
		.string({ error: message })
		.trim()
		.toLowerCase()
		.regex(/^[a-z]{2,8}$/, message);

/**
 * An amount as typed: digits, groups of three, one decimal mark ("699.99", "129,90",
 * "1.299,90"). What it is worth needs the region (its decimal mark) and the currency (its
 * digits), so the service reads it with domain/money.ts parseAmount and names the field.
 */
export const amount = (message = 'Enter an amount like 699.99.') =>
	z.string({ error: message }).trim().refine(looksLikeAmount, message);

// ---------------------------------------------------------------------------------------------
// Calendar dates
// ---------------------------------------------------------------------------------------------

export interface DateMessages {
	/** Not a string at all. */
	missing?: string;
	/** Not written YYYY-MM-DD. */
	shape?: string;
	/** Written so but no such day (2024-02-30, 2023-02-29). */
	real?: string;
}

/**
 * A calendar day written YYYY-MM-DD that exists: zod's `z.iso.date()` knows month lengths
 * and leap years (2024-02-29 yes, 2023-02-29 and 2024-02-30 no), where `Date.parse` rolls
 * 2024-02-30 over to 1 March.
 */
export function isoDate(messages: DateMessages = {}) {
	const shape = messages.shape ?? 'Enter a date as YYYY-MM-DD.';
	return z
		.string({ error: messages.missing ?? shape })
		.trim()
		.regex(/^\d{4}-\d{2}-\d{2}$/, shape)
		.pipe(z.iso.date({ error: messages.real ?? 'Enter a real date.' }));
}

/** YYYY-MM-DD of today in UTC. */
export function todayUtc(now: Date = new Date()): string {
	return now.toISOString().slice(0, 10);
}

/** A real day that is not after today (UTC); checked when parsed, so "today" is current. */
export function pastIsoDate(
	messages: DateMessages & { future?: string } = {},
	now: () => Date = () => new Date()
) {
	return isoDate(messages).refine(
		(d) => d <= todayUtc(now()),
		messages.future ?? 'The date cannot be in the future.'
	);
}
