import { z } from 'zod';

/** ?region=xx on the guide page and the pricing API: a region code as stored (lower case). */
export const regionQuery = z.strictObject({
	region: z
		.string()
		.trim()
		.toLowerCase()
		.regex(/^[a-z]{2,8}$/, 'A region code is 2–8 letters, e.g. "de".')
		.optional()
});
