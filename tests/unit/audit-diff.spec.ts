import { describe, expect, it } from 'vitest';
import { changedKeys, valueText } from '../../src/lib/domain/audit-diff';
import { auditQuery, auditWindow } from '../../src/lib/schemas/audit';

// Display rules of the audit page (product rules, no published source needed).
describe('audit diff', () => {
	it('lists only changed keys, sorted, with added and removed ones', () => {
		expect(
			changedKeys(
				{ role: 'reader', name: 'Ana', gone: 1 },
				{ role: 'author', name: 'Ana', added: { a: [1, 2] } }
			)
		).toEqual([
			{ key: 'added', before: null, after: '{"a":[1,2]}' },
			{ key: 'gone', before: '1', after: null },
			{ key: 'role', before: 'reader', after: 'author' }
		]);
		expect(changedKeys(null, { hidden: false })).toEqual([
			{ key: 'hidden', before: null, after: 'false' }
		]);
		expect(changedKeys({ same: [1] }, { same: [1] })).toEqual([]);
	});

	it('cuts long values with an ellipsis', () => {
		expect(valueText('x'.repeat(200), 10)).toBe(`${'x'.repeat(9)}…`);
		expect(valueText(null)).toBe('null');
	});
});

describe('audit query', () => {
	it('treats empty fields as no filter and turns days into a UTC window with an inclusive end day', () => {
		const q = auditQuery.parse({
			action: '',
			actor: ' ',
			subject: '',
			from: '2026-12-01',
			to: '2026-12-02',
			page: ''
		});
		expect(q).toMatchObject({ page: 1, from: '2026-12-01', to: '2026-12-02' });
		expect(auditWindow(q)).toEqual({
			from: new Date('2026-12-01T00:00:00Z'),
			to: new Date('2026-12-03T00:00:00Z')
		});
	});

	it('refuses bad values field by field', () => {
		const bad = auditQuery.safeParse({
			action: 'DROP TABLE',
			from: '2026-02-30',
			to: 'x',
			page: '0'
		});
		expect(bad.success).toBe(false);
		expect(bad.success ? [] : bad.error.issues.map((i) => i.path.join('.')).sort()).toEqual([
			'action',
			'from',
			'page',
			'to'
		]);
		const reversed = auditQuery.safeParse({ from: '2026-12-05', to: '2026-12-01' });
		expect(reversed.success ? [] : reversed.error.issues.map((i) => i.path.join('.'))).toEqual([
			'to'
		]);
		expect(auditQuery.safeParse({ extra: '1' }).success).toBe(false);
	});
});
