/** Cache-Control of the guide page and pricing answers (guide-caching.ts, visitor-answers.ts). */

/**
 * A shared cache (s-maxage) may keep a visitor's answer a minute and serve it a minute more
 * while it asks again. Browsers (max-age=0) ask every time, cheaply with If-None-Match: a
 * visitor sees a hidden guide or a new price on the next load, not a minute later.
 */
export const PUBLIC_CACHING = 'public, max-age=0, s-maxage=60, stale-while-revalidate=60';
export const PRIVATE_CACHING = 'private, no-store';
