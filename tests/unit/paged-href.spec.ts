import { describe, expect, it } from 'vitest';
import { pagedHref } from '../../src/lib/components/admin/paged-href';

describe('pagedHref', () => {
	it('keeps filters that differ from their defaults and adds the page after the first', () => {
		const href = pagedHref(
			{ kind: 'new', sort: 'oldest', author: 'Mira Falk', empty: '' },
			{ kind: 'all', sort: 'oldest' }
		);
		expect(href(1)).toBe('?kind=new&author=Mira+Falk');
		expect(href(3)).toBe('?kind=new&author=Mira+Falk&page=3');
	});

	it('links the first page of an unfiltered list as a bare query', () => {
		expect(pagedHref({ q: undefined, region: null })(1)).toBe('?');
	});
});
