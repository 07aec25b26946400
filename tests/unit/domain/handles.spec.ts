import { describe, expect, it } from 'vitest';
import { firstFreeHandle, handleBase, isHandle } from '$lib/domain/handles';

/* Author handles: lower-case ASCII, digits and single hyphens, 3–30 characters (our own rule). */
describe('author handles', () => {
	it('come from the name, accents dropped and spaces turned into hyphens', () => {
		expect(handleBase('Mira Falkenberg')).toBe('mira-falkenberg');
		expect(handleBase('Zoë  Ångström-Lund')).toBe('zoe-angstrom-lund');
		expect(handleBase('  Sam Okonkwo-Reyes ')).toBe('sam-okonkwo-reyes');
	});

	it('fall back to "member" when a name has too few Latin letters', () => {
		expect(handleBase('田中')).toBe('member');
		expect(handleBase(null)).toBe('member');
		expect(handleBase('42')).toBe('member');
	});

	it('are cut to 24 characters so a numeric suffix still fits in 30', () => {
		const base = handleBase('Maximiliana Wolkenstein-Ravensburg');
		expect(base).toBe('maximiliana-wolkenstein');
		expect(isHandle(`${base}-99999`)).toBe(true);
	});

	it('are numbered from 2 when taken', () => {
		expect(firstFreeHandle('aiko-tanabe', new Set())).toBe('aiko-tanabe');
		expect(firstFreeHandle('aiko-tanabe', new Set(['aiko-tanabe', 'aiko-tanabe-2']))).toBe(
			'aiko-tanabe-3'
		);
	});

	it('refuse upper case, double or trailing hyphens, a leading digit and wrong lengths', () => {
		for (const bad of ['Mira', 'mi--ra', 'mira-', '9mira', 'ab', 'a'.repeat(31), 'mi ra', 'mïra'])
			expect(isHandle(bad), bad).toBe(false);
		for (const good of ['abc', 'mira-f', 'a1b2', 'a'.repeat(30)])
			expect(isHandle(good), good).toBe(true);
	});
});
