/*
 * Length limits of the author-request forms, apart from the zod schemas so components can
 * show them (maxlength, hints) without shipping zod to the browser.
 */
export const PITCH_MIN_CHARS = 20;
export const PITCH_MAX_CHARS = 1000;
export const DECISION_NOTE_MAX_CHARS = 1000;
