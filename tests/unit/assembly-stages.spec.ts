import { describe, expect, it } from 'vitest';
import {
	ASSEMBLY_STAGES,
	cautionsFor,
	checklistProgress,
	stepsByStage
} from '../../src/lib/domain/assembly-stages';

/*
 * Build-notes steps per assembly stage: the rule documented in help/photos (a heading that is
 * a stage's name starts it; list items under it are its steps). Worked examples by hand.
 */
describe('stepsByStage', () => {
	it('files list items under the stage heading above them, in order', () => {
		const md = [
			'Read the manuals first.',
			'',
			'- Clear a table.',
			'',
			'### CPU cooler',
			'',
			'1. Apply a pea-sized dot of paste.',
			'2. Tighten the screws a few turns at a time,',
			'   crosswise.',
			'',
			'## Power supply and cabling',
			'- Fan facing the filtered vent.',
			'### Notes on noise',
			'- Not a stage: this step is general.'
		].join('\n');
		expect(stepsByStage(md)).toEqual({
			general: ['Clear a table.', 'Not a stage: this step is general.'],
			byStage: {
				cooler: [
					'Apply a pea-sized dot of paste.',
					'Tighten the screws a few turns at a time, crosswise.'
				],
				'psu-cabling': ['Fan facing the filtered vent.']
			}
		});
	});

	it('matches stage names regardless of case and punctuation, and by key', () => {
		expect(stepsByStage('### first BOOT!\n- Wait for memory training.').byStage).toEqual({
			'first-boot': ['Wait for memory training.']
		});
		expect(stepsByStage('#### graphics-card\n* Support the card.').byStage).toEqual({
			'graphics-card': ['Support the card.']
		});
	});

	it('gives a flat list (no stage headings) as general steps only', () => {
		expect(stepsByStage('1. One\n2. Two')).toEqual({ general: ['One', 'Two'], byStage: {} });
	});
});

describe('checklist progress', () => {
	it('counts ticked stages that exist, rounding the share down', () => {
		// 1 of 3 = 33.3 % → 33; 2 of 3 = 66.7 % → 66 (rounded down so 100 means every stage).
		const stages = ['cooler', 'psu-cabling', 'first-boot'] as const;
		expect(checklistProgress(stages, new Set(['cooler']))).toEqual({
			done: 1,
			total: 3,
			percent: 33
		});
		expect(checklistProgress(stages, new Set(['cooler', 'first-boot', 'storage']))).toEqual({
			done: 2,
			total: 3,
			percent: 66
		});
		expect(checklistProgress([], new Set())).toEqual({ done: 0, total: 0, percent: 0 });
	});
});

describe('stage cautions (common practice, no published source; docs/architecture.md safety rule)', () => {
	it('warns against opening a power supply where the PSU is fitted, and about mains where power is involved', () => {
		expect(cautionsFor('psu-cabling').join(' ')).toMatch(/Never open a power supply/);
		expect(cautionsFor('psu-cabling').join(' ')).toMatch(/unplug it from the mains/);
		expect(cautionsFor('first-boot').join(' ')).toMatch(/fully home/);
		expect(cautionsFor('cpu-memory').join(' ')).toMatch(/static/);
	});

	it('has nine stages in assembly order, each with at least one caution', () => {
		expect(ASSEMBLY_STAGES.map((s) => s.key)).toEqual([
			'prepare-case',
			'cpu-memory',
			'cooler',
			'board-into-case',
			'storage',
			'psu-cabling',
			'graphics-card',
			'cable-management',
			'first-boot'
		]);
		for (const s of ASSEMBLY_STAGES) expect(cautionsFor(s.key).length).toBeGreaterThan(0);
	});
});
