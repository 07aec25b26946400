/*
 * Demo pairing cautions, written by the demo editor. Idempotent by the natural key
 * (title): an existing rule is left as it is, so an editor's changes survive a re-seed.
 *
 * Chosen so they fire on no demo guide (no demo CPU has fewer than six cores and no demo
 * power supply is below 550 W), which keeps the demo guides' fit reports as the other
 * tests expect; they show for parts typed into POST /api/v1/fit. The advice is common
 * practice, no published source.
 */
import type { CautionCondition } from '../../../domain/pairing-cautions.js';
import type { Seeder } from '../umzug.js';
import { CautionRule, User } from '../models/index.js';

export const DEMO_CAUTION_EDITOR = 'editor@slotwise.test';

export const DEMO_CAUTION_RULES: ReadonlyArray<{
	title: string;
	message: string;
	conditions: CautionCondition[];
}> = [
	{
		title: 'Top Cobalt or Auric card with a CPU of fewer than six cores',
		message:
			'A Cobalt C8 or Auric A90 graphics card with a CPU of fewer than six cores: expect lower 1 % lows in busy game scenes, because the processor cannot keep the card fed. Consider a CPU with six or more cores.',
		conditions: [
			{ category: 'gpu', field: 'chip', operator: 'in', value: ['Cobalt C8', 'Auric A90'] },
			{ category: 'cpu', field: 'cores', operator: 'lt', value: 6 }
		]
	},
	{
		title: 'Graphics card on a 12V-2x6 plug with an older power supply',
		message:
			'This graphics card takes a 12V-2x6 plug and the power supply is not ATX 3.x: use the adapter that came with the card, push the plug fully home and keep the cable straight for the first few centimetres. Follow the card and power supply manuals.',
		conditions: [
			{ category: 'gpu', field: 'powerConnectors.h12v2x6', operator: 'gte', value: 1 },
			{ category: 'psu', field: 'atx3', operator: 'eq', value: false },
			{ category: 'psu', field: 'ratedW', operator: 'lt', value: 550 }
		]
	}
];

export const up: Seeder = async ({ context: sequelize }) => {
	await sequelize.transaction(async (transaction) => {
		const editor = await User.findOne({ where: { email: DEMO_CAUTION_EDITOR }, transaction });
		if (!editor)
			throw new Error(
				`Demo caution rules: no user ${DEMO_CAUTION_EDITOR} (run the demo community seeder first)`
			);
		for (const rule of DEMO_CAUTION_RULES) {
			await CautionRule.findOrCreate({
				where: { title: rule.title },
				defaults: { ...rule, active: true, authorId: editor.id },
				transaction
			});
		}
	});
};

export const down: Seeder = async ({ context: sequelize }) => {
	await sequelize.transaction(async (transaction) => {
		await CautionRule.destroy({
			where: { title: DEMO_CAUTION_RULES.map((r) => r.title) },
			transaction
		});
	});
};
