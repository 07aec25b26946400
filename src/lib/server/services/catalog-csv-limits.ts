/*
 * The catalog CSV import's size limits, apart from the import so the request hook can read
 * them without loading the catalog: a file of at most 1 MiB, in a request body held to 2 MB
 * (docs/deployment.md), which leaves room for the multipart framing with a wide margin.
 */

/** Largest file accepted (1 MiB). */
export const MAX_UPLOAD_BYTES = 1_048_576;
/** Largest request body the import route reads; the hook answers 413 above it (auth/hooks.ts). */
export const IMPORT_BODY_LIMIT_BYTES = 2 * 1024 * 1024;

export const CSV_TOO_LARGE_MESSAGE = `Upload at most ${MAX_UPLOAD_BYTES / 1024 / 1024} MB at a time.`;
