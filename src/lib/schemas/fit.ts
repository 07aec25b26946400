import { z } from 'zod';
import { PART_CATEGORIES } from '$lib/domain/types';

/**
 * POST /api/v1/fit: a build as slots, each a catalog part (partId) or specs typed in for a
 * part not in the catalog. Specs are checked against their category's schema in the
 * service, so messages can name the slot and field.
 */
const slotBase = {
	category: z.enum(PART_CATEGORIES),
	key: z.string().trim().min(1).max(40).optional(),
	label: z.string().trim().min(1).max(80).optional(),
	quantity: z.number().int().min(1).max(16).default(1)
};

export const fitSlotInput = z.union([
	z.strictObject({ ...slotBase, partId: z.number().int().positive() }),
	z.strictObject({
		...slotBase,
		brand: z.string().trim().min(1).max(80).default('Custom'),
		model: z.string().trim().min(1).max(120).default('part'),
		specs: z.record(z.string(), z.unknown())
	})
]);

export const fitInput = z.strictObject({
	slots: z.array(fitSlotInput).min(1, 'Send at least one slot.').max(40, 'At most 40 slots.')
});

export type FitInput = z.infer<typeof fitInput>;
export type FitSlotInput = z.infer<typeof fitSlotInput>;
