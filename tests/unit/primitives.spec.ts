import { describe, expect, it } from 'vitest';
import { pastDate } from '../../src/lib/schemas/build';
import { priceQuoteInput } from '../../src/lib/schemas/guide-editor';
import { fieldIssues } from '../../src/lib/schemas/issues';
import {
	VERSION_MESSAGE,
	isoDate,
	version,
	wholeNumberFromText,
	wholeNumberText
} from '../../src/lib/schemas/primitives';
import { priceSightingInput } from '../../src/lib/schemas/price-sightings';

/*
 * The shared input primitives (src/lib/schemas/primitives.ts). Calendar facts: ISO 8601 and
 * the Gregorian leap-year rule (docs/sources.md s14, value from memory). What `Number()` and
 * number inputs do with text: docs/sources.md s15 (from memory).
 */

describe('calendar dates', () => {
	it.each([
		['2024-02-29', true], // 2024 is divisible by 4
		['2000-02-29', true], // divisible by 400
		['2023-02-29', false],
		['1900-02-29', false], // divisible by 100, not by 400
		['2024-02-30', false],
		['2024-04-31', false], // April has 30 days
		['2024-13-01', false],
		['2024-1-01', false],
		['29.02.2024', false]
	])('%s exists: %s', (text, exists) => {
		expect(isoDate().safeParse(text).success).toBe(exists);
	});

	it('says which is wrong: the shape or the day', () => {
		expect(isoDate().safeParse('yesterday').error?.issues[0]?.message).toBe(
			'Enter a date as YYYY-MM-DD.'
		);
		expect(isoDate().safeParse('2024-02-30').error?.issues[0]?.message).toBe('Enter a real date.');
	});

	it('refuses 2024-02-30 in every date field that used to check it its own way', () => {
		// The build's price override and purchase date.
		expect(pastDate.safeParse('2024-02-30').success).toBe(false);
		// The guide editor's quote date: Date.parse rolled this over to 1 March and let it through.
		const quote = priceQuoteInput.safeParse({
			storeId: 1,
			amount: '129.90',
			observedAt: '2024-02-30'
		});
		expect(quote.success).toBe(false);
		expect(quote.error && fieldIssues(quote.error)).toEqual({
			observedAt: ['Enter a real date.']
		});
		// A reader's price sighting (now fixed at 1 March 2024, so the day is within 90 days).
		const sighting = priceSightingInput(new Date('2024-03-01T12:00:00Z')).safeParse({
			regionCode: 'de',
			storeId: '1',
			price: '129,90',
			observedOn: '2024-02-30',
			url: 'https://store.example/p/1'
		});
		expect(sighting.error && fieldIssues(sighting.error).observedOn).toEqual([
			'Enter a real date.'
		]);
		expect(pastDate.safeParse('2024-02-29').success).toBe(true);
	});
});

describe('whole numbers posted as text', () => {
	it.each([
		['5', 5],
		['05', 5], // decimal, never octal: a number input posts what was typed (s12)
		['1000', 1000]
	])('reads %j as %i', (text, value) => {
		expect(wholeNumberFromText(text)).toBe(value);
	});

	it.each(['0x10', '1.8e1', ' 5', '5 ', '+5', '-5', '5.0', '', '1_000', 'Infinity', '٥'])(
		'leaves %j as text, so the schema refuses it',
		(text) => {
			expect(wholeNumberFromText(text)).toBe(text);
			expect(wholeNumberText('Enter a whole number.').safeParse(text).success).toBe(false);
		}
	);

	it('keeps what is not text (JSON numbers, absent fields) for the schema to judge', () => {
		expect(wholeNumberFromText(7)).toBe(7);
		expect(wholeNumberFromText(undefined)).toBeUndefined();
	});

	it('refuses a version that is not a positive whole number, with one message', () => {
		for (const bad of ['0x10', '1.8e1', 0, -1, 1.5, '3', null]) {
			const parsed = version.safeParse(bad);
			expect(parsed.success, JSON.stringify(bad)).toBe(false);
			expect(parsed.error?.issues[0]?.message).toBe(VERSION_MESSAGE);
		}
		expect(version.parse(3)).toBe(3);
	});
});
