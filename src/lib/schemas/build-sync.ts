import { z } from 'zod';
import type { FormReader } from './form-data';
import { amount, version, wholeNumber } from './primitives';

/*
 * The build's sync and within-budget operations, one schema each, shared by the build page's
 * form actions and the JSON API (src/lib/server/api/build-sync.ts). Each schema is the JSON
 * body; each `…Form` function reads the page's form into that shape (schemas/form-data.ts).
 * Every body that changes a build carries the build's `version` (optimistic locking).
 */

const BUDGET_MESSAGE =
	'Send the budget as an amount in the build’s currency (e.g. "750.00") or a whole number of minor units (e.g. 75000 for USD 750.00).';

/**
 * A budget in the build region's currency: an amount as typed ("750", "750.00", "750,00"
 * where the region writes the decimal comma; what the page's field posts), or, as the API
 * has always taken it, a whole number of minor units (75000 for USD 750.00). The service
 * reads the text with the region's currency and decimal mark.
 */
const budget = z.union(
	[
		amount('Enter an amount like 1200 or 1199.99.'),
		wholeNumber(BUDGET_MESSAGE, 0, 100_000_000_000)
	],
	{ error: BUDGET_MESSAGE }
);

/** Row ids as the sync table gives them: `source:<source slot key>` or `local:<build slot id>`. */
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

/** The sync table: `choice:<row id>` radios and the "take every change that is not a conflict" button. */
export function syncApplyForm(f: FormReader) {
	return {
		version: f.number('version'),
		upstreamRevisionId: f.number('upstreamRevisionId'),
		takeAllNonConflicting: f.text('takeAll') === '1',
		choices: f.withPrefix('choice:')
	};
}

export const syncUndoInput = z.object({ version });

/**
 * "Not now": the owner declines the update they were offered, naming the revision the table
 * showed (a newer one published meanwhile is a new offer). It changes no slot, so it carries
 * no version: another tab's edits stay valid.
 */
export const syncDeclineInput = z.object({
	upstreamRevisionId: z
		.number({ error: 'Send the revision you were offered.' })
		.int('Send the revision you were offered.')
		.positive('Send the revision you were offered.')
});
export type SyncDeclineInput = z.infer<typeof syncDeclineInput>;

/** The sync table's "Not now" button: the offered revision (a hidden field of the same form). */
export function syncDeclineForm(f: FormReader) {
	return { upstreamRevisionId: f.number('upstreamRevisionId') };
}

export const withinBudgetInput = z.object({ budget });

/** "Find swaps": the budget as the reader typed it. */
export function withinBudgetForm(f: FormReader) {
	return { budget: f.text('budget') };
}

export const withinBudgetApplyInput = z.object({ budget, version });

/** "Apply these swaps": the proposal's budget in minor units (a hidden field) and the version. */
export function withinBudgetApplyForm(f: FormReader) {
	return { budget: f.number('budgetMinor'), version: f.number('version') };
}
