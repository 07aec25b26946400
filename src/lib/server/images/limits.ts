/*
 * Upload limits, apart from the pipeline so the request hook can read them without loading
 * sharp. Common practice, no published source: phone photos are 2–12 MB and at most about
 * 50 megapixels; 40 megapixels is far below sharp's own default of 268 (docs/sources.md 14).
 */
export const MAX_UPLOAD_BYTES = 15 * 1024 * 1024;
export const MAX_INPUT_PIXELS = 40_000_000;
/** Room for the multipart framing and the text fields around the file. */
export const UPLOAD_BODY_LIMIT_BYTES = MAX_UPLOAD_BYTES + 256 * 1024;

export function sizeLimitText(): string {
	return `${MAX_UPLOAD_BYTES / (1024 * 1024)} MB`;
}

export const TOO_LARGE_MESSAGE = `Photos may be at most ${sizeLimitText()}.`;
