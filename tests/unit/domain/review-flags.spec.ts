import { describe, expect, it } from 'vitest';
import {
	isKnownHost,
	linksIn,
	reviewFlags,
	STALE_QUOTE_DAYS
} from '../../../src/lib/domain/review-flags';
import type { ReviewFlagInput } from '../../../src/lib/domain/review-flags';

/*
 * Automatic review flags. The 30-day quote age is the review rule of issue 6 (common
 * practice for shelf prices, no published source). Referral parameters and paid-content
 * words are heuristics (common practice, no published source): they flag, the editor decides.
 */

const NOW = new Date('2026-12-02T12:00:00Z');

function input(overrides: Partial<ReviewFlagInput> = {}): ReviewFlagInput {
	return {
		disclosure: { kind: 'none', note: null },
		buildNotesMd: 'Seat the CPU by the triangle. Update firmware first.',
		walkthroughUrl: null,
		knownHosts: ['harbor.example', 'slotwise.test'],
		quotes: [
			{ slotLabel: 'CPU', observedAt: '2026-11-25T00:00:00Z', url: 'https://harbor.example/cpu' }
		],
		conflicts: [],
		now: NOW,
		...overrides
	};
}

describe('review flags', () => {
	it('raises nothing for a clean revision', () => {
		expect(reviewFlags(input())).toEqual([]);
	});

	it('flags a missing disclosure and a declared one that says nothing', () => {
		expect(
			reviewFlags(input({ disclosure: { kind: null, note: null } })).map((f) => f.kind)
		).toEqual(['disclosure']);
		const sponsored = reviewFlags(input({ disclosure: { kind: 'sponsored', note: '  ' } }));
		expect(sponsored).toHaveLength(1);
		expect(sponsored[0]?.message).toContain('which parts were provided');
		expect(
			reviewFlags(
				input({ disclosure: { kind: 'affiliate', note: 'Store links earn a commission.' } })
			)
		).toEqual([]);
	});

	it('flags "none" when links carry referral parameters or the text speaks of sponsorship', () => {
		const referral = reviewFlags(
			input({ buildNotesMd: 'Buy it [here](https://harbor.example/cpu?ref=ada42).' })
		);
		expect(referral.map((f) => f.kind)).toEqual(['disclosure']);
		expect(referral[0]?.message).toContain('referral parameter');
		const words = reviewFlags(input({ buildNotesMd: 'The case was sponsored by the maker.' }));
		expect(words.map((f) => f.kind)).toEqual(['disclosure']);
		// A query string without a referral key is fine.
		expect(
			reviewFlags(input({ buildNotesMd: 'See https://harbor.example/cpu?color=black.' }))
		).toEqual([]);
	});

	it('flags links to unknown hosts once per host, subdomains of known hosts pass', () => {
		const flags = reviewFlags(
			input({
				buildNotesMd:
					'Guide: https://odd-shop.example/a and https://odd-shop.example/b, also <https://shop.harbor.example/x>.',
				walkthroughUrl: 'https://clips.example/walk'
			})
		);
		expect(flags.filter((f) => f.kind === 'unknown_link').map((f) => f.message)).toEqual([
			'Links to odd-shop.example, which is not a known store or this site.',
			'Links to clips.example, which is not a known store or this site.'
		]);
		expect(isKnownHost('shop.harbor.example', ['harbor.example'])).toBe(true);
		expect(isKnownHost('evilharbor.example', ['harbor.example'])).toBe(false);
	});

	it('finds links in Markdown without trailing punctuation', () => {
		expect(
			linksIn('One [a](https://a.example/x). Two <https://b.example/y>, three https://c.example/z!')
		).toEqual(['https://a.example/x', 'https://b.example/y', 'https://c.example/z']);
	});

	it(`flags quotes older than ${STALE_QUOTE_DAYS} days, not those exactly ${STALE_QUOTE_DAYS} days old`, () => {
		const flags = reviewFlags(
			input({
				quotes: [
					{ slotLabel: 'CPU', observedAt: '2026-11-02T12:00:00Z', url: null }, // 30 days
					{ slotLabel: 'Board', observedAt: '2026-11-01T12:00:00Z', url: null } // 31 days
				]
			})
		);
		expect(flags).toEqual([
			{ kind: 'stale_quote', message: 'Board: the quoted price is 31 days old (more than 30).' }
		]);
	});

	it('repeats each fit conflict as a flag', () => {
		const flags = reviewFlags(
			input({ conflicts: [{ message: 'The CPU needs socket AM5; the board has LGA1700.' }] })
		);
		expect(flags).toEqual([
			{
				kind: 'fit_conflict',
				message: 'Fit conflict: The CPU needs socket AM5; the board has LGA1700.'
			}
		]);
	});
});
