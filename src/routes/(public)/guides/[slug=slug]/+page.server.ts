import { error } from '@sveltejs/kit';
import { revisionCompareQuery } from '$lib/schemas/guide-page';
import { regionQuery } from '$lib/schemas/guides';
import * as guides from '$lib/server/services/guides';
import * as guideViews from '$lib/server/services/guide-view-cache';
import { cachingHeaders } from '$lib/server/http/guide-caching';
import { reportForm, reportInput } from '$lib/schemas/content-reports';
import type { Issues } from '$lib/schemas/issues';
import { currentUser, requireUser } from '$lib/server/auth/guards';
import { formAnswers, parseForm, readFormData } from '$lib/server/http/answers';
import * as contentReports from '$lib/server/services/content-reports';
import { pageExtras } from '$lib/server/services/guide-page-extras';
import type { RevisionDiff } from '$lib/views';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async ({ params, url, locals, setHeaders }) => {
	// ?region=xx works without JavaScript; a bad or unknown code falls back to the base region.
	const query = regionQuery.safeParse({ region: url.searchParams.get('region') ?? undefined });
	const wanted = query.success ? (query.data.region ?? null) : null;
	// A hidden guide is shown only to its author and editors (with the reason); others get 404.
	const viewer = currentUser();
	// The hook has read the stamp unless MariaDB was down then; reading it here meets the outage.
	const stamp = locals.guideStamp ?? (await guideViews.readStamp(params.slug));
	// The computed view is cached per revision and region (guide-view-cache.ts).
	let outcome = await guideViews.guidePage(params.slug, wanted, viewer, stamp);
	let regionProblem = query.success ? null : 'That is not a region code.';
	if (outcome.kind === 'unknown_region') {
		regionProblem = `We have no region “${wanted}”. Showing the guide's base region.`;
		outcome = await guideViews.guidePage(params.slug, null, viewer, stamp);
	}
	if (outcome.kind !== 'ok' || !stamp) error(404, 'Guide not found');
	// Public with an ETag for visitors, private for the signed in (http/guide-caching.ts).
	setHeaders(cachingHeaders(locals));
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
		// The guide's id from the page read: the guide is not fetched by slug a second time.
		...(await pageExtras(
			params.slug,
			stamp,
			guide.slots.map((s) => s.pick.slug)
		))
	};
};

/**
 * Files a report on the guide or on one supporter's note, answering in the form's own slot
 * (`report` or `noteReport`, which also names the note) so the message shows where it was sent.
 */
async function fileReport(
	request: Request,
	subject: { type: 'guide'; key: string } | { type: 'tip_note'; key: string; noteId: number }
) {
	const me = requireUser();
	const form = await readFormData(request);
	const noun = subject.type === 'guide' ? 'guide' : 'note';
	const slot = (answer: Record<string, unknown>) =>
		subject.type === 'guide'
			? { report: answer }
			: { noteReport: { ...answer, noteId: subject.noteId } };
	const reported = formAnswers({
		notFound: () => slot({ problem: true, message: `This ${noun} is no longer available.` }),
		// The reader's text comes back with the messages.
		invalid: (issues: Issues) =>
			slot({ issues, category: form.text('category') ?? '', detail: form.text('detail') ?? '' }),
		conflict: (outcome) =>
			slot({ problem: true, message: 'message' in outcome ? outcome.message : '' })
	});
	const input = parseForm(form, reportInput, reportForm);
	if (input.kind !== 'ok') return reported.failure(input);
	const outcome = await contentReports.report(me.id, subject.type, subject.key, input.data);
	return reported.answer(outcome, (ok) =>
		slot({
			problem: false,
			message: ok.created
				? 'Thank you: your report is with the editors.'
				: `You have already reported this ${noun} and the editors have not decided yet; nothing new was filed.`
		})
	);
}

export const actions: Actions = {
	/** "Report this guide": signed-in people only; a repeat while the first is open changes nothing. */
	report: ({ params, request }) => fileReport(request, { type: 'guide', key: params.slug }),
	/** "Report this note" on a supporter's public note (?note=<tip id>); the same path as any report. */
	reportNote: ({ request, url }) => {
		const key = url.searchParams.get('note') ?? '';
		return fileReport(request, { type: 'tip_note', key, noteId: Number(key) || 0 });
	}
};
