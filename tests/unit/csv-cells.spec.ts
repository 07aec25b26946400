import { describe, expect, it } from 'vitest';
import { decodeCsvBytes, neutraliseCell } from '../../src/lib/server/csv-cells';

/*
 * Cell escaping for the catalog export, after OWASP "CSV Injection": a cell that starts
 * with =, +, -, @, tab or carriage return is run as a formula by spreadsheet programs;
 * a leading single quote makes them show it as text.
 */
describe('neutraliseCell (OWASP "CSV Injection" trigger characters)', () => {
	it.each([
		['=1+1', "'=1+1"],
		["=cmd|' /C calc'!A0", "'=cmd|' /C calc'!A0"],
		['+SUM(A1)', "'+SUM(A1)"],
		['-2+3', "'-2+3"],
		['@SUM(A1)', "'@SUM(A1)"],
		['\t=1', "'\t=1"],
		['\r=1', "'\r=1"],
		['  =1', "'  =1"]
	])('prefixes %j with a single quote', (input, output) => {
		expect(neutraliseCell(input)).toBe(output);
	});

	it.each([
		'Draftwell',
		'Breeze 120',
		'{"sizeMm":120}',
		'a=b',
		'x-1',
		'name@example',
		'',
		"'quoted",
		'12.5'
	])('leaves %j exactly as it is', (input) => {
		expect(neutraliseCell(input)).toBe(input);
	});
});

describe('decodeCsvBytes', () => {
	const utf8 = (s: string) => new TextEncoder().encode(s);

	it('decodes UTF-8 and drops a UTF-8 byte-order mark', () => {
		expect(decodeCsvBytes(utf8('a,Brückner\n'))).toEqual({ ok: true, text: 'a,Brückner\n' });
		expect(decodeCsvBytes(Uint8Array.from([0xef, 0xbb, 0xbf, ...utf8('a,b')]))).toEqual({
			ok: true,
			text: 'a,b'
		});
	});

	it('names the first bad byte and its line in a Latin-1 file', () => {
		const bytes = Uint8Array.from([...utf8('a,b\nBr'), 0xfc, ...utf8('ckner\n')]);
		const result = decodeCsvBytes(bytes);
		expect(result.ok).toBe(false);
		if (!result.ok) expect(result.reason).toContain('not valid UTF-8 (byte 7, line 2)');
	});

	it('refuses an overlong encoding and a lone surrogate as invalid UTF-8', () => {
		// C0 AF is an overlong "/"; ED A0 80 encodes the surrogate U+D800.
		expect(decodeCsvBytes(Uint8Array.from([0x61, 0xc0, 0xaf])).ok).toBe(false);
		expect(decodeCsvBytes(Uint8Array.from([0x61, 0xed, 0xa0, 0x80])).ok).toBe(false);
	});

	it('recognises UTF-16 by its BOM, and without one by its NUL bytes', () => {
		const le = Uint8Array.from([0x61, 0, 0x2c, 0, 0x62, 0]);
		for (const bytes of [
			le,
			Uint8Array.from([0xff, 0xfe, ...le]),
			Uint8Array.from([0xfe, 0xff, 0, 0x61])
		]) {
			const result = decodeCsvBytes(bytes);
			expect(result.ok).toBe(false);
			if (!result.ok) expect(result.reason).toMatch(/UTF-16/);
		}
	});
});
