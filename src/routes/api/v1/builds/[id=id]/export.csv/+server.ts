import { exportCsv } from '$lib/server/api/builds';
import type { RequestHandler } from './$types';

/** The build's shopping list as CSV in its region's currency (formula-safe cells). */
export const GET: RequestHandler = (event) => exportCsv(event);
