import { fail } from '@sveltejs/kit';
import { issuesSentence } from '$lib/schemas/issues';
import { upkeepDigestInput } from '$lib/schemas/upkeep';
import { requireRole } from '$lib/server/auth/guards';
import { formAnswers, parseForm, readFormData } from '$lib/server/http/answers';
import * as reviewQueue from '$lib/server/services/review-queue';
import * as upkeep from '$lib/server/services/upkeep-dashboard';
import { User } from '$lib/server/db';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireRole('author', 'editor');
	const [guides, alerts, setAside, me] = await Promise.all([
		reviewQueue.authorDashboard(user.id),
		upkeep.openAlerts(user.id),
		upkeep.setAsideAlerts(user.id),
		User.findByPk(user.id, { attributes: ['upkeepDigest', 'upkeepMoveThresholdBp'] })
	]);
	return {
		guides,
		alerts,
		setAside,
		digest: me?.upkeepDigest ?? false,
		thresholdPercent: Math.round((me?.upkeepMoveThresholdBp ?? 1000) / 100)
	};
};

/** Upkeep answers: a bad field or someone else's alert answers in place, never a 500. */
const { answer } = formAnswers({
	notFound: () => ({ upkeepMessage: 'That alert is not on one of your guides.' }),
	invalid: (issues) => ({ upkeepMessage: issuesSentence(issues) }),
	conflict: (outcome) => ({ upkeepMessage: 'message' in outcome ? outcome.message : 'Try again.' })
});

export const actions: Actions = {
	snooze: async ({ request }) => {
		const user = requireRole('author', 'editor');
		const form = await readFormData(request);
		const outcome = await upkeep.snoozeAlert(user.id, {
			alertId: form.number('alertId'),
			days: form.number('days')
		});
		return answer(outcome, () => ({ upkeepMessage: 'Snoozed; it comes back if still true then.' }));
	},
	restore: async ({ request }) => {
		const user = requireRole('author', 'editor');
		const form = await readFormData(request);
		const outcome = await upkeep.bringBack(user.id, { alertId: form.number('alertId') });
		return answer(outcome, () => ({ upkeepMessage: 'Back among the open alerts.' }));
	},
	handle: async ({ request }) => {
		const user = requireRole('author', 'editor');
		const form = await readFormData(request);
		const outcome = await upkeep.markHandled(user.id, { alertId: form.number('alertId') });
		return answer(outcome, () => ({ upkeepMessage: 'Marked handled.' }));
	},
	digest: async ({ request }) => {
		const user = requireRole('author', 'editor');
		const parsed = parseForm(await readFormData(request), upkeepDigestInput, (f) => ({
			enabled: f.boolean('enabled')
		}));
		if (parsed.kind === 'invalid')
			return fail(400, { upkeepMessage: issuesSentence(parsed.issues) });
		await upkeep.setDigest(user.id, parsed.data.enabled);
		return {
			upkeepMessage: parsed.data.enabled ? 'The weekly digest is on.' : 'The weekly digest is off.'
		};
	},
	threshold: async ({ request }) => {
		const user = requireRole('author', 'editor');
		const form = await readFormData(request);
		const outcome = await upkeep.setMoveThreshold(user.id, { percent: form.number('percent') });
		if (outcome.kind === 'invalid')
			return fail(400, {
				thresholdIssues: outcome.issues,
				percent: form.text('percent'),
				thresholdMessage: 'The threshold was not changed.'
			});
		if (outcome.kind !== 'ok') return fail(409, { thresholdMessage: 'Try again.' });
		return {
			thresholdMessage: `Saved: alerts come when a total moves more than ${outcome.percent} % since publication.`
		};
	}
};
