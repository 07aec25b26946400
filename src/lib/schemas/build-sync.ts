import { z } from 'zod';

/*
 * JSON bodies of the build sync and within-budget API (src/lib/server/api/build-sync.ts).
 * Every body that changes a build carries the build's `version` (optimistic locking).
 */

const version = z
	.number({ error: 'Send the build’s version (a whole number).' })
	.int('Send the build’s version (a whole number).')
	.min(1, 'Send the build’s version (a whole number).');

/** Minor units of the build region's currency (cents for USD, yen for JPY). */
const budget = z
	.number({
		error: 'Send the budget as a whole number of minor units (e.g. 75000 for USD 750.00).'
	})
	.int('Send the budget as a whole number of minor units (e.g. 75000 for USD 750.00).')
	.min(0, 'A budget cannot be negative.')
	.max(100_000_000_000, 'That budget is larger than Slotwise handles.');

/** Row ids as the sync table gives them: `source:<slot label>` or `local:<build slot id>`. */
const rowId = z
	.string()
	.regex(/^(source:.{1,80}|local:[1-9][0-9]{0,9})$/, 'Unknown row in the sync table.');

export const syncApplyInput = z.object({
	version,
	choices: z
		.record(
			rowId,
			z.enum(['take_upstream', 'keep_local'], { error: 'Choose take_upstream or keep_local.' })
		)
		.default({}),
	takeAllNonConflicting: z.boolean({ error: 'Send true or false.' }).default(false),
	upstreamRevisionId: z.number().int().positive().optional()
});
export type SyncApplyInput = z.infer<typeof syncApplyInput>;

export const syncUndoInput = z.object({ version });

export const withinBudgetInput = z.object({ budget });

export const withinBudgetApplyInput = z.object({ budget, version });
