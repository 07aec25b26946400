import { describe, expect, it } from 'vitest';
import { match } from '../../src/params/slug';

describe('slug route parameter', () => {
	it.each(['budget-1080p-starter', 'a1', 'x'])('accepts %s', (slug) =>
		expect(match(slug)).toBe(true)
	);
	it.each([
		'Upper-Case',
		'-leading',
		'trailing-',
		'two--dashes',
		'spa ce',
		'../etc',
		'a'.repeat(141)
	])('rejects %s', (slug) => expect(match(slug)).toBe(false));
});
