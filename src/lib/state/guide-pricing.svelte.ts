/*
 * Region re-pricing on the guide page without a reload. The page's server data stays the
 * source of truth: a fetched pricing only replaces it until the data changes (a real
 * navigation), so the no-JavaScript GET form and this enhancement never disagree.
 */
import type { PricedGuide } from '$lib/views';

export class GuidePricing {
	#source: () => PricedGuide;
	// Raw: a deep proxy would break the identity check against the page data below.
	#fetched = $state.raw<{ base: PricedGuide; guide: PricedGuide } | null>(null);
	#controller: AbortController | null = null;
	loading = $state(false);
	problem = $state<string | null>(null);

	constructor(source: () => PricedGuide) {
		this.#source = source;
	}

	/** The guide as currently priced: the fetched region's, or the page data's. */
	get guide(): PricedGuide {
		const base = this.#source();
		const fetched = this.#fetched;
		return fetched && fetched.base === base ? fetched.guide : base;
	}

	/** Fetches the guide priced in `region`; the latest request wins. Returns false on failure. */
	async switchTo(region: string, fetcher: typeof fetch = fetch): Promise<boolean> {
		const base = this.#source();
		this.#controller?.abort();
		const controller = new AbortController();
		this.#controller = controller;
		this.loading = true;
		this.problem = null;
		try {
			const url = `/api/v1/guides/${encodeURIComponent(base.slug)}/pricing?region=${encodeURIComponent(region)}`;
			const response = await fetcher(url, {
				signal: controller.signal,
				headers: { accept: 'application/json' }
			});
			const body = await response.json();
			if (!response.ok) {
				this.problem =
					typeof body?.message === 'string' ? body.message : 'Prices could not be loaded.';
				return false;
			}
			this.#fetched = { base, guide: body as PricedGuide };
			return true;
		} catch (e) {
			if ((e as Error).name === 'AbortError') return false;
			this.problem = 'Prices could not be loaded. Use the Show button to reload the page.';
			return false;
		} finally {
			if (this.#controller === controller) {
				this.loading = false;
				this.#controller = null;
			}
		}
	}
}
