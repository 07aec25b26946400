import { getBuild, patchBuild } from '$lib/server/api/builds';
import type { RequestHandler } from './$types';

/** A build as its owner (or, when shared, another signed-in reader) sees it; changes are the owner's, version-checked. */
export const GET: RequestHandler = (event) => getBuild(event);
export const PATCH: RequestHandler = (event) => patchBuild(event);
