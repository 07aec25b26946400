import { describe, expect, it } from 'vitest';
import { formFields } from '$lib/schemas/account';
import { noticeSettingsInput } from '$lib/schemas/following';
import { fieldIssues } from '$lib/schemas/issues';

/*
 * Form fields named after Object.prototype members, as the fuzz suite posts them: the notice
 * settings answered 500 to `constructor=%00` (the issue list met
 * Object.prototype.constructor). It must be a plain refusal with a message. A body holding
 * only `__proto__=…` left the notice settings no field at all, and they saved "everything
 * off" with a 200; kept as an own key, `__proto__` made the answer unserialisable (500).
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

	it('drops a field named "__proto__" without touching the prototype', () => {
		const fields = formFields(form('__proto__=%00&name=Ada'));
		expect(Object.keys(fields)).toEqual(['name']);
		expect(Object.getPrototypeOf(fields)).toBe(Object.prototype);
	});

	it('refuses notice settings posted without their form (no field, or only unknown ones)', () => {
		for (const body of ['', '__proto__=%00', 'role=admin']) {
			expect(noticeSettingsInput.safeParse(formFields(form(body))).success).toBe(false);
		}
	});

	it('reads the notice form with every box unticked as "everything off"', () => {
		const parsed = noticeSettingsInput.safeParse(formFields(form('form=notice-settings')));
		expect(parsed.success).toBe(true);
		if (parsed.success)
			expect(Object.values(parsed.data).every((c) => !c.inApp && !c.email)).toBe(true);
	});
});
