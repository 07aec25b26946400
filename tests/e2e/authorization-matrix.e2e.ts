import { expect, request as playwrightRequest, test } from '@playwright/test';
import type { APIRequestContext } from '@playwright/test';
import { BASE_URL } from '../playwright.config';
import { discoverRoutes, urlOf } from './routes';
import { DEMO_PASSWORD } from './support';

/*
 * The authorization matrix (ASVS 8.2.1): every page, form action and API route found under
 * src/routes, for every role, against the table below. A route that is not in the table
 * fails the test, so each new route must be added with its expected outcomes.
 */
type Role = 'visitor' | 'reader' | 'author' | 'editor' | 'admin';
type Outcome = 'ok' | 'signin' | 'forbidden' | 'notfound';
const ROLES: Role[] = ['visitor', 'reader', 'author', 'editor', 'admin'];

const everyone = (o: Outcome): Record<Role, Outcome> => ({
	visitor: o,
	reader: o,
	author: o,
	editor: o,
	admin: o
});
const signedIn: Record<Role, Outcome> = {
	visitor: 'signin',
	reader: 'ok',
	author: 'ok',
	editor: 'ok',
	admin: 'ok'
};
const authors: Record<Role, Outcome> = {
	visitor: 'signin',
	reader: 'forbidden',
	author: 'ok',
	editor: 'ok',
	admin: 'ok'
};
const editors: Record<Role, Outcome> = {
	visitor: 'signin',
	reader: 'forbidden',
	author: 'forbidden',
	editor: 'ok',
	admin: 'ok'
};
/** The author's own guide: other roles that may author still get 404 for someone else's. */
const ownGuide: Record<Role, Outcome> = {
	visitor: 'signin',
	reader: 'forbidden',
	author: 'ok',
	editor: 'notfound',
	admin: 'notfound'
};
/** Someone else's (here: a missing) build: visitors are sent to sign in, everyone else gets 404. */
const ownBuild: Record<Role, Outcome> = {
	visitor: 'signin',
	reader: 'notfound',
	author: 'notfound',
	editor: 'notfound',
	admin: 'notfound'
};
/** A guide's fork insights: its author (the sample guide's) and editors; a 404 for anyone else. */
const insightsAccess: Record<Role, Outcome> = {
	visitor: 'notfound',
	reader: 'notfound',
	author: 'ok',
	editor: 'ok',
	admin: 'ok'
};

/** An editor-only record that does not exist: editors and admins get 404. */
const missingForEditors: Record<Role, Outcome> = {
	visitor: 'signin',
	reader: 'forbidden',
	author: 'forbidden',
	editor: 'notfound',
	admin: 'notfound'
};
const admins: Record<Role, Outcome> = {
	visitor: 'signin',
	reader: 'forbidden',
	author: 'forbidden',
	editor: 'forbidden',
	admin: 'ok'
};

// "ok" means the request got past authorization (a page, a redirect elsewhere, or a 400
// for the empty form this test posts); nothing here is meant to succeed at changing data.
const EXPECTED: Record<string, Record<Role, Outcome>> = {
	'GET /(public)': everyone('ok'),
	'GET /(public)/guides/[slug=slug]': everyone('ok'),
	'GET /(public)/guides/[slug=slug]/print': everyone('ok'),
	'GET /(public)/parts': everyone('ok'),
	'GET /(public)/parts/[slug=slug]': everyone('ok'),
	// Signed in to report a price; the empty form the matrix posts is refused with 400 ("ok").
	'POST /(public)/parts/[slug=slug]?/reportPrice': signedIn,
	'GET /(editor)/editor/sightings': editors,
	'POST /(editor)/editor/sightings?/verify': editors,
	'POST /(editor)/editor/sightings?/reject': editors,
	'GET /api/v1/parts': everyone('ok'),
	'GET /api/v1/parts/[slug=slug]': everyone('ok'),
	'GET /help': everyone('ok'),
	'GET /help/writing-guides': everyone('ok'),
	'GET /help/alternates-and-fit': everyone('ok'),
	'GET /help/regional-pricing': everyone('ok'),
	'GET /help/safety': everyone('ok'),
	'GET /help/review': everyone('ok'),
	'GET /help/builds': everyone('ok'),
	'GET /help/api': everyone('ok'),
	'GET /(public)/guides': everyone('ok'),
	'GET /(public)/guides/feed.xml': everyone('ok'),
	'GET /api/v1/guides': everyone('ok'),
	'GET /api/v1/guides/[slug=slug]': everyone('ok'),
	'GET /api/health': everyone('ok'),
	// Public computation; the matrix posts a form, which the JSON-only hook refuses with 415.
	'POST /api/v1/fit': everyone('ok'),
	'GET /api/v1/guides/[slug=slug]/pricing': everyone('ok'),
	'GET /api/v1/fx': everyone('ok'),
	'GET /(editor)/editor/rates': editors,
	'POST /(editor)/editor/rates?/refresh': editors,
	'GET /(auth)/signin': everyone('ok'),
	'POST /(auth)/signin?/password': everyone('ok'),
	'POST /(auth)/signin?/link': everyone('ok'),
	'GET /(auth)/signin/check-email': everyone('ok'),
	'GET /(auth)/signup': everyone('ok'),
	'POST /(auth)/signup?/default': everyone('ok'),
	'GET /(auth)/verify': everyone('ok'),
	'POST /(auth)/verify?/default': everyone('ok'),
	'GET /(auth)/verify/email': everyone('ok'),
	'POST /(auth)/verify/email?/default': everyone('ok'),
	'GET /(auth)/reset': everyone('ok'),
	'POST /(auth)/reset?/default': everyone('ok'),
	'GET /(auth)/reset/[token]': everyone('ok'),
	'POST /(auth)/reset/[token]?/default': everyone('ok'),
	'GET /(auth)/signout': everyone('ok'),
	'POST /(auth)/signout?/default': everyone('ok'),
	'GET /(account)/account': signedIn,
	'POST /(account)/account?/profile': signedIn,
	'POST /(account)/account?/email': signedIn,
	'POST /(account)/account?/password': signedIn,
	'POST /(account)/account?/requestAuthor': signedIn,
	'POST /(account)/account?/delete': signedIn,
	// Newsletter and notice settings on the account page: the probe form is refused (400) or
	// changes nothing (no subscription to leave).
	'POST /(account)/account?/newsletter': signedIn,
	'POST /(account)/account?/leaveNewsletter': signedIn,
	'POST /(account)/account?/notices': signedIn,
	'GET /(account)/notices': signedIn,
	'POST /(account)/notices?/open': signedIn,
	'POST /(account)/notices?/unread': signedIn,
	'POST /(account)/notices?/allRead': signedIn,
	// The newsletter is public. The token pages answer 400 for the missing token ("ok": past
	// authorization); the one-click POST needs no session (RFC 8058).
	'GET /(public)/newsletter': everyone('ok'),
	'POST /(public)/newsletter?/subscribe': everyone('ok'),
	'POST /(public)/newsletter?/manageLink': everyone('ok'),
	'GET /(public)/newsletter/confirm': everyone('ok'),
	'POST /(public)/newsletter/confirm?/default': everyone('ok'),
	'GET /(public)/newsletter/manage': everyone('ok'),
	'POST /(public)/newsletter/manage?/save': everyone('ok'),
	'POST /(public)/newsletter/manage?/unsubscribe': everyone('ok'),
	'GET /(public)/newsletter/unsubscribe': everyone('ok'),
	'POST /(public)/newsletter/unsubscribe?/default': everyone('ok'),
	// The same one-click POST as mail providers send it (no Accept for HTML): +server.ts.
	'POST /(public)/newsletter/unsubscribe': everyone('ok'),
	// The sample handle is the demo author's; following needs a session (the probe body is a 400).
	'GET /(public)/authors/[handle]': everyone('ok'),
	'POST /(public)/authors/[handle]?/follow': signedIn,
	'POST /(public)/authors/[handle]?/unfollow': signedIn,
	// Mailings: editors only. The sample id names no mailing: the page, the progress endpoint
	// and the actions that look it up answer 404; the probe body to ?/save is refused first (400).
	'GET /(editor)/editor/mailings': editors,
	'POST /(editor)/editor/mailings?/create': editors,
	'GET /(editor)/editor/mailings/[id=id]': missingForEditors,
	'GET /(editor)/editor/mailings/[id=id]/progress': missingForEditors,
	'POST /(editor)/editor/mailings/[id=id]?/save': missingForEditors,
	'POST /(editor)/editor/mailings/[id=id]?/test': missingForEditors,
	'POST /(editor)/editor/mailings/[id=id]?/start': missingForEditors,
	'POST /(editor)/editor/mailings/[id=id]?/resend': missingForEditors,
	'GET /(author)/my/guides': authors,
	// Upkeep answers on My guides: the empty probe form is refused with 400 for authors and editors.
	'POST /(author)/my/guides?/snooze': authors,
	'POST /(author)/my/guides?/handle': authors,
	'POST /(author)/my/guides?/digest': authors,
	'POST /(author)/my/guides?/threshold': authors,
	'POST /(author)/my/guides?/restore': authors,
	// Fork insights (issue 19): the sample guide is the demo author's; its author and editors see
	// them, everyone else gets the 404 of a guide that does not exist (never a sign-in page).
	'GET /(owner)/my/guides/[slug=slug]/insights': insightsAccess,
	'GET /api/v1/guides/[slug=slug]/insights': insightsAccess,
	'GET /(author)/my/guides/new': authors,
	'POST /(author)/my/guides/new?/create': authors,
	// The sample slug is the demo author's own guide: other editors and admins get a 404 (owner only).
	'GET /(author)/my/guides/[slug=slug]/edit': ownGuide,
	'POST /(author)/my/guides/[slug=slug]/edit?/edit': ownGuide,
	'POST /(author)/my/guides/[slug=slug]/edit?/preview': ownGuide,
	'POST /(author)/my/guides/[slug=slug]/edit?/save': ownGuide,
	'POST /(author)/my/guides/[slug=slug]/edit?/submit': ownGuide,
	// Author JSON API: the matrix posts a form, refused with 415 before auth; guide-editor.e2e.ts
	// checks roles and ownership with JSON bodies.
	'POST /api/v1/guides': everyone('ok'),
	'GET /api/v1/guides/[slug=slug]/draft': {
		visitor: 'signin',
		reader: 'forbidden',
		author: 'ok',
		editor: 'notfound',
		admin: 'notfound'
	},
	'PUT /api/v1/guides/[slug=slug]/draft': everyone('ok'),
	'POST /api/v1/guides/[slug=slug]/submit': everyone('ok'),
	'GET /(editor)/editor/author-requests': editors,
	'POST /(editor)/editor/author-requests?/decide': editors,
	'GET /(editor)/editor': editors,
	'GET /(editor)/editor/parts': editors,
	'GET /(editor)/editor/parts/new': editors,
	'POST /(editor)/editor/parts/new?/create': editors,
	'GET /(editor)/editor/parts/[slug=slug]': editors,
	'POST /(editor)/editor/parts/[slug=slug]?/save': editors,
	'POST /(editor)/editor/parts/[slug=slug]?/withdrawQuote': editors,
	'GET /(editor)/editor/parts/export.csv': editors,
	'GET /(editor)/editor/parts/import': editors,
	'POST /(editor)/editor/parts/import?/upload': editors,
	'POST /(editor)/editor/parts/import?/confirm': editors,
	'POST /(editor)/editor/parts/import?/discard': editors,
	'GET /(editor)/editor/parts/import/template.csv': editors,
	'GET /(editor)/editor/stores': editors,
	'POST /(editor)/editor/stores?/create': editors,
	'POST /(editor)/editor/stores?/update': editors,
	'POST /(editor)/editor/stores?/delete': editors,
	'GET /(editor)/editor/quotes': editors,
	'POST /(editor)/editor/quotes?/create': editors,
	'POST /(editor)/editor/quotes?/withdrawQuote': editors,
	'GET /(editor)/editor/regions': editors,
	'GET /(editor)/editor/regions/[code]': editors,
	'POST /(editor)/editor/regions/[code]?/settings': editors,
	'POST /(editor)/editor/regions/[code]?/addRate': editors,
	'POST /(editor)/editor/regions/[code]?/removeRate': editors,
	'GET /api/v1/regions': everyone('ok'),
	'GET /(admin)/admin/users': admins,
	'POST /(admin)/admin/users?/changeRole': admins,
	'POST /(admin)/admin/users?/setDisabled': admins,
	// Content reports: the matrix posts an empty form (400 for signed-in people, nothing filed).
	'POST /(public)/guides/[slug=slug]?/report': signedIn,
	// A supporter's note: the same rule as the guide (the empty probe form is a 400, nothing filed).
	'POST /(public)/guides/[slug=slug]?/reportNote': signedIn,
	'GET /(editor)/editor/reports': editors,
	'POST /(editor)/editor/reports?/dismiss': editors,
	'POST /(editor)/editor/reports?/hide': editors,
	'POST /(editor)/editor/reports?/restore': editors,
	'GET /(admin)/admin/audit': admins,
	// Review: the sample revision is a demo guide's published revision 1 (its page shows the
	// decision already taken); the matrix's empty decision form is a 400 for editors.
	'GET /(editor)/review': editors,
	'GET /(editor)/review/[id=id]': editors,
	'POST /(editor)/review/[id=id]?/decide': editors,
	'GET /(editor)/review/guides': editors,
	'GET /(editor)/review/guides/[slug=slug]': editors,
	'POST /(editor)/review/guides/[slug=slug]?/moderate': editors,
	// Builds: the sample id names no build, so the page answers 404 to everyone (another
	// reader's private build answers exactly the same); an edit needs a signed-in user, and then
	// the page behind the action answers 404 for a build that is not theirs or does not exist.
	'GET /(public)/builds/[id=id]': everyone('notfound'),
	'GET /(public)/builds/[id=id]/print': everyone('notfound'),
	'GET /(public)/builds/[id=id]/export.csv': everyone('notfound'),
	'POST /(public)/builds/[id=id]?/swap': ownBuild,
	'POST /(public)/builds/[id=id]?/delete': ownBuild,
	'POST /(public)/builds/[id=id]?/quantity': ownBuild,
	'POST /(public)/builds/[id=id]?/override': ownBuild,
	'POST /(public)/builds/[id=id]?/purchase': ownBuild,
	'POST /(public)/builds/[id=id]?/removeSlot': ownBuild,
	'POST /(public)/builds/[id=id]?/addSlot': ownBuild,
	'POST /(public)/builds/[id=id]?/settings': ownBuild,
	'POST /(public)/builds/[id=id]?/sync': ownBuild,
	'POST /(public)/builds/[id=id]?/undoSync': ownBuild,
	'POST /(public)/builds/[id=id]?/declineUpdate': ownBuild,
	'POST /(public)/builds/[id=id]?/proposeBudget': ownBuild,
	'POST /(public)/builds/[id=id]?/applyBudget': ownBuild,
	'POST /(public)/builds/[id=id]?/tick': ownBuild,
	// Report a photo of a finished build: like reporting the build (400 for the probe, then 404).
	'POST /(public)/builds/[id=id]?/reportPhoto': {
		visitor: 'signin',
		reader: 'notfound',
		author: 'notfound',
		editor: 'notfound',
		admin: 'notfound'
	},
	// Report a build: visitors are sent to sign in. Signed in, the empty probe form is refused
	// (400), then the page's load answers 404 for the sample id, which names no build.
	'POST /(public)/builds/[id=id]?/report': {
		visitor: 'signin',
		reader: 'notfound',
		author: 'notfound',
		editor: 'notfound',
		admin: 'notfound'
	},
	'GET /(account)/builds': signedIn,
	'POST /(account)/builds/new?/default': signedIn,
	// The development mailbox exists only on a loopback-only server using the local SMTP fake (as
	// here); deployment.e2e.ts checks the 404 elsewhere.
	'GET /dev/mailbox': everyone('ok'),
	'POST /dev/mailbox?/clear': everyone('ok'),
	'GET /dev/mailbox/[id]': everyone('notfound'),
	'GET /dev/mailbox/[id]/html': everyone('notfound'),
	'GET /(editor)/editor/cautions': editors,
	'POST /(editor)/editor/cautions?/deactivate': editors,
	'POST /(editor)/editor/cautions?/activate': editors,
	'POST /(editor)/editor/cautions?/delete': editors,
	'GET /(editor)/editor/cautions/new': editors,
	'POST /(editor)/editor/cautions/new?/create': editors,
	// The sample id is the first demo caution rule (seeder 2026.12.05T12.00.00.demo-caution-rules).
	'GET /(editor)/editor/cautions/[id=id]': editors,
	'POST /(editor)/editor/cautions/[id=id]?/save': editors,
	// Build sync and within budget (owner only): the sample build id does not exist, so signed-in
	// people get 404 and visitors 401 from requireUser; the form POSTs are refused with 415 before auth.
	'GET /api/v1/builds/[id=id]/sync': {
		visitor: 'signin',
		reader: 'notfound',
		author: 'notfound',
		editor: 'notfound',
		admin: 'notfound'
	},
	'POST /api/v1/builds/[id=id]/sync': everyone('ok'),
	'POST /api/v1/builds/[id=id]/sync/undo': everyone('ok'),
	'POST /api/v1/builds/[id=id]/sync/decline': everyone('ok'),
	'POST /api/v1/builds/[id=id]/within-budget': everyone('ok'),
	'POST /api/v1/builds/[id=id]/within-budget/apply': everyone('ok'),
	// Builds JSON API (services/build-view.ts, build-edits.ts): the sample build id does not exist, so GET answers 401
	// to visitors (requireUser) and 404 to everyone signed in; the CSV export follows the build's
	// own visibility (visitors may export a public or linked build), so a missing build is 404 for
	// all. The form bodies the matrix sends to PATCH/POST/DELETE are refused with 415 before auth.
	'POST /api/v1/guides/[slug=slug]/fork': everyone('ok'),
	'GET /api/v1/builds/[id=id]': {
		visitor: 'signin',
		reader: 'notfound',
		author: 'notfound',
		editor: 'notfound',
		admin: 'notfound'
	},
	'PATCH /api/v1/builds/[id=id]': everyone('ok'),
	'POST /api/v1/builds/[id=id]/slots': everyone('ok'),
	'PATCH /api/v1/builds/[id=id]/slots/[slotId=id]': everyone('ok'),
	'DELETE /api/v1/builds/[id=id]/slots/[slotId=id]': everyone('ok'),
	'GET /api/v1/builds/[id=id]/export.csv': everyone('notfound'),
	// Photo uploads take multipart only; the matrix posts a urlencoded form, which the hook
	// refuses with 415 before auth (photos.e2e.ts checks roles and ownership with real files).
	// Deletes are JSON like the rest of the API, so the form body is a 415 as well.
	'POST /api/v1/guides/[slug=slug]/photos': everyone('ok'),
	'DELETE /api/v1/guides/[slug=slug]/photos/[id=id]': everyone('ok'),
	// An upload's processing status: its guide's author only (the sample id names no photo, so
	// the demo author gets 404 too; photos.e2e.ts follows a real upload to ready).
	'GET /api/v1/guides/[slug=slug]/photos/[id=id]': {
		visitor: 'signin',
		reader: 'notfound',
		author: 'notfound',
		editor: 'notfound',
		admin: 'notfound'
	},
	'POST /api/v1/parts/[slug=slug]/photos': everyone('ok'),
	'DELETE /api/v1/parts/[slug=slug]/photos/[id=id]': everyone('ok'),
	'POST /api/v1/builds/[id=id]/photos': everyone('ok'),
	'DELETE /api/v1/builds/[id=id]/photos/[photoId=id]': everyone('ok'),
	// Photo files: the sample key names no photo, so everyone gets 404.
	'GET /media/[...key]': everyone('notfound'),
	'GET /help/photos': everyone('ok'),
	// Tips (issue 20). The form is public (visitors see a sign-in link); paying needs an account,
	// and the empty probe form is refused with 400 before anything reaches the provider.
	'GET /(public)/guides/[slug=slug]/tip': everyone('ok'),
	'POST /(public)/guides/[slug=slug]/tip?/default': signedIn,
	// The return from the provider: without a session id it is a 404 for everyone signed in.
	'GET /(account)/tips/thanks': {
		visitor: 'signin',
		reader: 'notfound',
		author: 'notfound',
		editor: 'notfound',
		admin: 'notfound'
	},
	// The provider's webhook proves itself by signature, not by session: the matrix's form body
	// is refused with 415 before that (tip-webhooks.spec.ts tests the signature itself).
	'POST /api/payments/webhook': everyone('ok'),
	'GET /(author)/my/earnings': authors,
	'POST /(author)/my/earnings?/settings': authors,
	'GET /(author)/my/earnings/export.csv': authors,
	'GET /(admin)/admin/tips': admins,
	'POST /(admin)/admin/tips?/refund': admins
};

function classify(status: number, location: string | undefined): Outcome {
	if (status === 401) return 'signin';
	if ((status === 302 || status === 303) && location && /\/signin(\?|$)/.test(location))
		return 'signin';
	if (status === 403) return 'forbidden';
	if (status === 404) return 'notfound';
	return 'ok';
}

async function contextFor(role: Role): Promise<APIRequestContext> {
	const context = await playwrightRequest.newContext({ baseURL: BASE_URL });
	if (role === 'visitor') return context;
	const response = await context.post('/signin?/password', {
		form: { email: `${role}@slotwise.test`, password: DEMO_PASSWORD },
		headers: { origin: BASE_URL, accept: 'text/html' },
		maxRedirects: 0
	});
	expect(response.status(), `${role} signs in`).toBe(303);
	return context;
}

test('every route under src/routes is in the authorization table, and nothing stale is', () => {
	expect(discoverRoutes()).toEqual(Object.keys(EXPECTED).sort());
});

const SIGN_OUT = 'POST /(auth)/signout?/default';

for (const role of ROLES) {
	test(`authorization matrix for the ${role}`, async () => {
		let signedInState = await (await contextFor(role)).storageState();
		const mismatches: string[] = [];
		for (const entry of discoverRoutes()) {
			const expected = EXPECTED[entry]?.[role];
			// A fresh context per request, so no cookie one entry changes reaches the next.
			const context = await playwrightRequest.newContext({
				baseURL: BASE_URL,
				storageState: signedInState
			});
			const { method, url } = urlOf(entry);
			const response = await context.fetch(url, {
				method,
				headers: { origin: BASE_URL, accept: 'text/html' },
				form: method === 'GET' ? undefined : { probe: '1' },
				maxRedirects: 0
			});
			const got = classify(response.status(), response.headers()['location']);
			if (got !== expected)
				mismatches.push(
					`${entry} (${method} ${url}): expected ${expected}, got ${got} (${response.status()})`
				);
			await context.dispose();
			// Signing out ends every session of the account on the server (docs/security.md §3),
			// the one the following entries share too: sign in afresh.
			if (entry === SIGN_OUT && role !== 'visitor')
				signedInState = await (await contextFor(role)).storageState();
		}
		expect(mismatches).toEqual([]);
	});
}
