/*
 * The app-wide e-mail address schema. Attack cases are docs/security.md §8's list
 * (nodemailer advisories GHSA-mm7p-fcc7-pg87 quoted local part, GHSA-vvjj-xcjg-gr5g CRLF,
 * the quadratic-parser DoS fixed in 9.1.0/10.0.6) and ASVS v5.0.0 1.3.11 (mail injection):
 * each must be refused, with a field message, in under 50 ms.
 * Length limits: RFC 5321 §4.5.3.1.1 (local part 64 octets) and §4.5.3.1.3 (path 256
 * octets including the angle brackets, so 254 for the address) — value from memory (M).
 */
import { describe, expect, it } from 'vitest';
import { EMAIL_MESSAGES, emailAddress } from '../../src/lib/schemas/email';

function refusal(input: unknown): { message: string; ms: number } {
	const started = performance.now();
	const result = emailAddress.safeParse(input);
	const ms = performance.now() - started;
	expect(
		result.success,
		`expected ${String(JSON.stringify(input)).slice(0, 80)} to be refused`
	).toBe(false);
	return { message: result.error?.issues[0]?.message ?? '', ms };
}

describe('emailAddress refuses docs/security.md §8 attacks, each in under 50 ms', () => {
	const tenThousandCommas = Array.from({ length: 10_000 }, (_, i) => `u${i}@x.test`).join(',');

	it.each([
		['quoted local part', '"a@evil.test"@victim.test', EMAIL_MESSAGES.quoted],
		['two addresses with a comma', 'a@x.test,b@y.test', EMAIL_MESSAGES.list],
		['CRLF Bcc injection', 'a@x.test\r\nBcc: c@y.test', EMAIL_MESSAGES.lineBreak],
		['fullwidth ＠ (U+FF20)', 'a＠x.test', EMAIL_MESSAGES.lookalikeAt],
		['a 10k-address comma list', tenThousandCommas, EMAIL_MESSAGES.list],
		['a 10k bare-comma string', `a@x.test${','.repeat(10_000)}`, EMAIL_MESSAGES.list]
	])('%s', (_label, input, message) => {
		// Warm-up first, so the timing measures the schema rather than the first JIT pass.
		emailAddress.safeParse('warm@up.test');
		const refused = refusal(input);
		expect(refused.message).toBe(message);
		expect(refused.ms).toBeLessThan(50);
	});
});

describe('emailAddress refuses other malformed input with a clear message', () => {
	it.each([
		['lone CR', 'a@x.test\rb', EMAIL_MESSAGES.lineBreak],
		['lone LF', 'a@x.test\n', EMAIL_MESSAGES.lineBreak],
		['trailing CRLF (not trimmed away)', 'a@x.test\r\n', EMAIL_MESSAGES.lineBreak],
		['Unicode line separator', 'a@x.test\u2028Bcc: c@y.test', EMAIL_MESSAGES.lineBreak],
		['small commercial at (U+FE6B)', 'a﹫x.test', EMAIL_MESSAGES.lookalikeAt],
		['fullwidth ＠ beside a real @', 'a＠b@x.test', EMAIL_MESSAGES.lookalikeAt],
		['semicolon list', 'a@x.test;b@y.test', EMAIL_MESSAGES.list],
		['space-separated list', 'a@x.test b@y.test', EMAIL_MESSAGES.list],
		['tab inside', 'a@x.test\tb@y.test', EMAIL_MESSAGES.list],
		['fullwidth comma (a comma after NFKC)', 'a@x.test，b@y.test', EMAIL_MESSAGES.list],
		['display name with brackets', 'Ana<a@x.test>', EMAIL_MESSAGES.angle],
		['two @', 'a@b@x.test', EMAIL_MESSAGES.manyAt],
		['no @', 'ana.example.test', EMAIL_MESSAGES.missingAt],
		['empty', '', EMAIL_MESSAGES.required],
		['only spaces', '   ', EMAIL_MESSAGES.required],
		['local part of 65', `${'a'.repeat(65)}@x.test`, EMAIL_MESSAGES.localTooLong],
		['no dot in the domain', 'a@localhost', EMAIL_MESSAGES.shape],
		['leading dot', '.a@x.test', EMAIL_MESSAGES.shape],
		['double dot', 'a..b@x.test', EMAIL_MESSAGES.shape],
		['label starting with a hyphen', 'a@-x.test', EMAIL_MESSAGES.shape],
		['IP literal', 'a@[127.0.0.1]', EMAIL_MESSAGES.shape],
		['numeric top-level domain', 'a@x.123', EMAIL_MESSAGES.shape],
		['NUL byte', 'a\u0000b@x.test', EMAIL_MESSAGES.nonAscii],
		['non-ASCII letter after NFKC', 'jürgen@x.test', EMAIL_MESSAGES.nonAscii]
	])('%s', (_label, input, message) => {
		expect(refusal(input).message).toBe(message);
	});

	it('a 255-character input is refused as too long (length check is exact)', () => {
		const local = 'a'.repeat(64);
		const domain = `${'b'.repeat(63)}.${'c'.repeat(63)}.${'d'.repeat(57)}.test`; // 63+1+63+1+57+5 = 190
		expect(`${local}@${domain}`.length).toBe(255); // 64 + 1 + 190
		expect(refusal(`${local}@${domain}`).message).toBe(EMAIL_MESSAGES.tooLong);
		const ok = `${local}@${domain.slice(1)}`;
		expect(ok.length).toBe(254);
		expect(emailAddress.parse(ok)).toBe(ok);
	});

	it.each([undefined, null, 42, {}])('refuses the non-string %s', (input) => {
		expect(refusal(input).message).toBe(EMAIL_MESSAGES.required);
	});
});

describe('emailAddress accepts plain addresses and normalises them', () => {
	it.each([
		['ana@example.test', 'ana@example.test'],
		['  ana@example.test  ', 'ana@example.test'],
		['Ana.Lind@Example.TEST', 'Ana.Lind@example.test'],
		["o'brien+builds@mail.example.co.uk", "o'brien+builds@mail.example.co.uk"],
		['first_last-2@sub-domain.example.test', 'first_last-2@sub-domain.example.test'],
		['ana@xn--bcher-kva.example', 'ana@xn--bcher-kva.example'],
		// NFKC: fullwidth letters and digits become ASCII; only the look-alike @ is refused.
		['ａｎａ１@ｅｘａｍｐｌｅ.test', 'ana1@example.test'],
		['ana@example.test\u3000', 'ana@example.test']
	])('%s → %s', (input, expected) => {
		expect(emailAddress.parse(input)).toBe(expected);
	});
});
