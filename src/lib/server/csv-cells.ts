/*
 * Byte- and cell-level CSV rules with no database or framework imports, so they can be
 * unit-tested on their own: what encodings an upload may use, and how an exported cell
 * is kept from being run as a formula by a spreadsheet program.
 */
import { startsLikeFormula } from '$lib/schemas/catalog-upkeep';

/**
 * The file's text, or why it is not UTF-8. A UTF-8 byte-order mark is accepted (some
 * spreadsheet programs write one); UTF-16 is recognised by its BOM or, without one, by
 * the NUL bytes that ASCII text has in it, so the message can say what to do.
 */
export function decodeCsvBytes(
	bytes: Uint8Array
): { ok: true; text: string } | { ok: false; reason: string } {
	const utf16 =
		'The file is UTF-16 text. Save it as "CSV UTF-8" (comma-separated, UTF-8) and upload it again.';
	if (
		bytes.length >= 2 &&
		((bytes[0] === 0xff && bytes[1] === 0xfe) || (bytes[0] === 0xfe && bytes[1] === 0xff))
	) {
		return { ok: false, reason: utf16 };
	}
	if (bytes.includes(0)) {
		return { ok: false, reason: `${utf16} (It contains NUL bytes, which CSV text never has.)` };
	}
	try {
		let text = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(bytes);
		if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
		return { ok: true, text };
	} catch {
		return {
			ok: false,
			reason: `The file is not valid UTF-8 (${firstBadByte(bytes)}). Save it as "CSV UTF-8" and upload it again; older spreadsheet programs save in a local code page unless told otherwise.`
		};
	}
}

/** Where the first byte that breaks UTF-8 is, for the message ("byte 1234 on line 5"). */
function firstBadByte(bytes: Uint8Array): string {
	// Character by character: each slice is one sequence whose length its lead byte gives,
	// and the fatal decoder checks its continuation bytes, overlong forms and surrogates.
	const decoder = new TextDecoder('utf-8', { fatal: true });
	let line = 1;
	let i = 0;
	while (i < bytes.length) {
		const b = bytes[i] ?? 0;
		const len =
			b < 0x80
				? 1
				: b >= 0xc2 && b <= 0xdf
					? 2
					: b >= 0xe0 && b <= 0xef
						? 3
						: b >= 0xf0 && b <= 0xf4
							? 4
							: 0;
		if (len === 0 || i + len > bytes.length) break;
		try {
			decoder.decode(bytes.subarray(i, i + len));
		} catch {
			break;
		}
		if (b === 0x0a) line++;
		i += len;
	}
	return `byte ${i + 1}, line ${line}`;
}

/**
 * A cell made safe for spreadsheet programs: one that would start a formula (=, +, -, @,
 * tab, carriage return) gets a leading single quote, which they show as text (OWASP
 * "CSV Injection"). Everything else is left exactly as it is.
 */
export function neutraliseCell(value: string): string {
	return startsLikeFormula(value) ? `'${value}` : value;
}
