import { describe, expect, it } from 'vitest';
import { redirectTarget } from '../../src/lib/schemas/account';

/*
 * Where sign-in may send someone afterwards (issue 12, item 4; docs/security.md §1; OWASP
 * ASVS v5.0.0 3.7.2, redirects only to allow-listed destinations: the number from memory).
 * The WHATWG URL Standard's parser removes ASCII tab and newline anywhere in the input and
 * treats "\" like "/" in http(s) URLs ("basic URL parser", special schemes; from memory,
 * and what Node's URL does), which is how
 * "/<TAB>/evil.example" and "/\evil.example" become the network-path reference
 * "//evil.example" in a browser. Expected targets below are worked out by hand from those
 * two rules.
 */
const parse = (value: unknown) => redirectTarget.parse(value);

describe('redirectTarget', () => {
	it('keeps same-site paths with their query and fragment', () => {
		expect(parse('/')).toBe('/');
		expect(parse('/guides/steady-1080p-starter')).toBe('/guides/steady-1080p-starter');
		expect(parse('/builds?tab=mine#top')).toBe('/builds?tab=mine#top');
		// Percent-encoded text stays encoded: the target is a path, never decoded twice.
		expect(parse('/guides?q=%2F%2Fevil.example')).toBe('/guides?q=%2F%2Fevil.example');
	});

	it('sends every way of reaching another origin to the home page', () => {
		for (const hostile of [
			'//evil.example',
			'/\t/evil.example',
			'/\n/evil.example',
			'/\r\n/evil.example',
			'\t//evil.example',
			'/\\evil.example',
			'\\\\evil.example',
			'/%09/evil.example/'.replace('%09', '\t'),
			'https://evil.example/',
			'http:evil.example',
			'javascript:alert(1)',
			'data:text/html,<script>alert(1)</script>',
			' //evil.example',
			'///evil.example',
			'/.//evil.example'
		]) {
			const target = parse(hostile);
			expect(target, JSON.stringify(hostile)).toBe('/');
		}
	});

	it('gives the default for control characters, backslashes and non-Latin-1 text instead of failing', () => {
		for (const odd of [
			'/guides\u0000',
			'/guides\u001b[31m',
			'/guides\u007f',
			'/a\\b',
			'/guides/\u2028',
			'/guides/\u{1F600}',
			'/gu\u0131des',
			'/\ud800',
			'',
			'guides',
			'x'.repeat(600)
		]) {
			expect(parse(odd), JSON.stringify(odd)).toBe('/');
		}
		expect(parse(undefined)).toBe('/');
		expect(parse(42)).toBe('/');
	});

	it('returns the normalised path, so nothing odd reaches the Location header', () => {
		// Dot segments are resolved by the URL parser ("/a/../b" → "/b"); spaces are encoded.
		expect(parse('/guides/../builds')).toBe('/builds');
		expect(parse('/guides?q=a b')).toBe('/guides?q=a%20b');
		// Latin-1 letters are fine and come back percent-encoded as UTF-8 ("é" → %C3%A9).
		expect(parse('/guides?q=caf\u00e9')).toBe('/guides?q=caf%C3%A9');
	});
});
