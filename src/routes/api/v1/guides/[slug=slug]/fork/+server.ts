import { forkGuide } from '$lib/server/api/builds';
import type { RequestHandler } from './$types';

/** Forks the guide's published revision into a new private build of the signed-in reader: 201 { id }. */
export const POST: RequestHandler = (event) => forkGuide(event);
