import { error, fail } from '@sveltejs/kit';
import { revisionCompareQuery } from '$lib/schemas/guide-page';
import { regionQuery } from '$lib/schemas/guides';
import * as buildLists from '$lib/server/services/build-lists';
import * as guides from '$lib/server/services/guides';
import { formFields } from '$lib/schemas/account';
import { reportInput } from '$lib/schemas/content-reports';
import { fieldIssues } from '$lib/schemas/issues';
import { currentUser, requireUser } from '$lib/server/auth/guards';
import * as contentReports from '$lib/server/services/content-reports';
import { publishedGallery } from '$lib/server/services/gallery';
import { partThumbs } from '$lib/server/services/photos';
import type { RevisionDiff } from '$lib/views';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url }) => {
	// ?region=xx works without JavaScript; a bad or unknown code falls back to the base region.
	const query = regionQuery.safeParse({ region: url.searchParams.get('region') ?? undefined });
	const wanted = query.success ? (query.data.region ?? null) : null;
	// A hidden guide is shown only to its author and editors (with the reason); others get 404.
	const viewer = currentUser();
	let outcome = await guides.getGuidePage(params.slug, wanted, undefined, viewer);
	let regionProblem = query.success ? null : 'That is not a region code.';
	if (outcome.kind === 'unknown_region') {
		regionProblem = `We have no region “${wanted}”. Showing the guide's base region.`;
		outcome = await guides.getGuidePage(params.slug, null, undefined, viewer);
	}
	if (outcome.kind !== 'ok') error(404, 'Guide not found');
	const { guide, extras, hidden } = outcome.page;

	// ?from=&to= compares two published revisions (GET form in the revision history).
	const latest = guide.revisionNumber;
	let compare = { from: Math.max(1, latest - 1), to: latest };
	let diff: RevisionDiff | null = null;
	let compareProblem: string | null = null;
	if (url.searchParams.has('from') || url.searchParams.has('to')) {
		const parsed = revisionCompareQuery.safeParse({
			from: url.searchParams.get('from'),
			to: url.searchParams.get('to')
		});
		if (!parsed.success) {
			compareProblem = parsed.error.issues[0]?.message ?? 'Pick two revisions.';
		} else {
			compare = parsed.data;
			const result = await guides.getRevisionDiff(
				params.slug,
				parsed.data.from,
				parsed.data.to,
				viewer
			);
			if (result.kind === 'ok') diff = result.diff;
			else compareProblem = 'This guide has no such published revision.';
		}
	}
	return {
		guide,
		extras,
		hidden: hidden ?? null,
		regionProblem,
		compare,
		diff,
		compareProblem,
		lineage: await buildLists.lineage(params.slug),
		gallery: await publishedGallery(params.slug),
		partThumbs: await partThumbs(guide.slots.map((s) => s.pick.slug))
	};
};

export const actions: Actions = {
	/** "Report this guide": signed-in people only; a repeat while the first is open changes nothing. */
	report: async ({ params, request }) => {
		const me = requireUser();
		const fields = formFields(await request.formData());
		const input = reportInput.safeParse(fields);
		if (!input.success) {
			return fail(400, {
				report: {
					issues: fieldIssues(input.error),
					category: fields.category ?? '',
					detail: fields.detail ?? ''
				}
			});
		}
		const outcome = await contentReports.report(me.id, 'guide', params.slug, input.data);
		if (outcome.kind === 'not_found')
			return fail(404, {
				report: { problem: true, message: 'This guide is no longer available.' }
			});
		if (outcome.kind === 'conflict')
			return fail(409, { report: { problem: true, message: outcome.message } });
		return {
			report: {
				problem: false,
				message: outcome.created
					? 'Thank you: your report is with the editors.'
					: 'You have already reported this guide and the editors have not decided yet; nothing new was filed.'
			}
		};
	}
};
