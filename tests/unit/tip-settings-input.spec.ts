import { describe, expect, it } from 'vitest';
import { tipSettingsInput } from '$lib/schemas/tips';

describe('tip settings input', () => {
	it('refuses a body without the message field instead of reading it as "tips off, no message"', () => {
		const parsed = tipSettingsInput.safeParse({});
		expect(parsed.success).toBe(false);
		expect(parsed.error?.issues.map((i) => [i.path.join('.'), i.message])).toEqual([
			['thankYouMessage', 'Send the tip settings from their form.']
		]);
	});

	it('takes the form as it posts: an unticked box and an empty message turn tips off', () => {
		expect(tipSettingsInput.parse({ thankYouMessage: '' })).toEqual({
			tipsEnabled: false,
			thankYouMessage: ''
		});
		expect(
			tipSettingsInput.parse({ tipsEnabled: 'on', thankYouMessage: ' Thanks!\r\nMira ' })
		).toEqual({ tipsEnabled: true, thankYouMessage: 'Thanks!\nMira' });
	});
});
