import { deleteSlot, patchSlot } from '$lib/server/api/builds';
import type { RequestHandler } from './$types';

/** Swap, quantity, price override and purchase tracker of one slot; or remove it. Owner only, version-checked. */
export const PATCH: RequestHandler = (event) => patchSlot(event);
export const DELETE: RequestHandler = (event) => deleteSlot(event);
