import { describe, expect, it } from 'vitest';
import { formFields } from '$lib/schemas/account';
import { noticeSettingsInput } from '$lib/schemas/following';
import { fieldIssues } from '$lib/schemas/issues';

/*
 * Form fields named after Object.prototype members, as the fuzz suite posts them: the notice
 * settings answered 500 to `constructor=%00` (the issue list met
 * Object.prototype.constructor). It must be a plain refusal with a message. A field named
 * `__proto__` set the reader's prototype instead of a key, so the notice settings saw no
 * field at all and saved "everything off" with a 200.
 */
function form(body: string): FormData {
	const data = new FormData();
	for (const [key, value] of new URLSearchParams(body)) data.append(key, value);
	return data;
}

describe('hostile field names', () => {
	it('lists an issue on a field named "constructor" like any other', () => {
		const parsed = noticeSettingsInput.safeParse(formFields(form('constructor=%00')));
		expect(parsed.success).toBe(false);
		if (!parsed.success) {
			const issues = fieldIssues(parsed.error);
			expect(Object.values(issues).flat().length).toBeGreaterThan(0);
			expect(Object.values(issues).every((m) => Array.isArray(m))).toBe(true);
		}
	});

	it('keeps a field named "__proto__" as a field, so the notice settings refuse it', () => {
		const fields = formFields(form('__proto__=%00'));
		expect(Object.keys(fields)).toEqual(['__proto__']);
		expect(Object.getPrototypeOf(fields)).toBe(Object.prototype);
		expect(noticeSettingsInput.safeParse(fields).success).toBe(false);
	});
});
