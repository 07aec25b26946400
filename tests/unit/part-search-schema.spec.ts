import { describe, expect, it } from 'vitest';
import { parsePartSearchLenient, parsePartSearchStrict } from '$lib/schemas/parts';

const strict = (qs: string) => parsePartSearchStrict(new URLSearchParams(qs));
const lenient = (qs: string) => parsePartSearchLenient(new URLSearchParams(qs));

describe('catalog search query', () => {
	it('coerces URL strings and treats blank form fields as no filter', () => {
		const parsed = strict('q=+cobalt+&category=gpu&minVramGb=12&maxLengthMm=&page=2');
		expect(parsed).toEqual({
			ok: true,
			query: {
				q: 'cobalt',
				category: 'gpu',
				page: 2,
				region: undefined,
				sort: 'name',
				specFilters: { minVramGb: 12 }
			}
		});
		expect(strict('')).toEqual({
			ok: true,
			query: { q: '', category: undefined, page: 1, sort: 'name', specFilters: {} }
		});
		expect(strict('category=')).toMatchObject({ ok: true, query: { category: undefined } });
	});

	it.each([
		['colour=red', '_form'],
		['category=gpu&maxLengthMm=5000', 'maxLengthMm'],
		['category=gpu&maxLengthMm=0', 'maxLengthMm'],
		['category=gpu&maxLengthMm=1.5', 'maxLengthMm'],
		['category=gpu&minVramGb=lots', 'minVramGb'],
		['category=cpu&minVramGb=8', 'minVramGb'],
		['minCores=8', 'minCores'],
		['category=psu&formFactor=Mini-ITX', 'formFactor'],
		['category=storage&interface=usb', 'interface'],
		['category=toaster', 'category'],
		['page=-1', 'page'],
		['q=' + 'x'.repeat(101), 'q'],
		['q=a&q=b', 'q']
	])('strict: refuses %s with a message for %s', (qs, field) => {
		const parsed = strict(qs);
		expect(parsed.ok).toBe(false);
		if (!parsed.ok) expect(parsed.issues[field]?.[0]).toEqual(expect.any(String));
	});

	it('lenient: drops only what is wrong and says why', () => {
		const { query, issues } = lenient(
			'q=cobalt&category=gpu&minVramGb=16&maxLengthMm=5000&colour=red'
		);
		expect(query).toEqual({
			q: 'cobalt',
			category: 'gpu',
			page: 1,
			sort: 'name',
			specFilters: { minVramGb: 16 }
		});
		expect(Object.keys(issues).sort()).toEqual(['_form', 'maxLengthMm']);
	});

	it('lenient: a bad category also drops the filters that needed it', () => {
		const { query, issues } = lenient('category=toaster&socket=AM5&q=halvard');
		expect(query).toEqual({
			q: 'halvard',
			category: undefined,
			page: 1,
			sort: 'name',
			specFilters: {}
		});
		expect(Object.keys(issues).sort()).toEqual(['category', 'socket']);
	});
});
