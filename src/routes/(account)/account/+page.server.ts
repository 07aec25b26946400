import { error, fail, redirect } from '@sveltejs/kit';
import {
	changeEmailInput,
	changePasswordInput,
	deleteAccountInput,
	formFields,
	profileInput
} from '$lib/schemas/account';
import { authorRequestInput } from '$lib/schemas/author-requests';
import { noticeSettingsInput } from '$lib/schemas/following';
import { fieldIssues } from '$lib/schemas/issues';
import { newsletterFields, newsletterPreferences } from '$lib/schemas/newsletter';
import { requireUser } from '$lib/server/auth/guards';
import { signOut } from '$lib/server/auth/sign-in';
import * as limits from '$lib/server/rate-limit';
import { emailChangeChecks } from '$lib/server/rate-limit-keys';
import { tooManyRequests } from '$lib/server/rate-limit-response';
import * as accounts from '$lib/server/services/accounts';
import * as authorRequests from '$lib/server/services/author-requests';
import * as notices from '$lib/server/services/notices';
import * as subscribers from '$lib/server/services/subscribers';
import * as subscriberAccounts from '$lib/server/services/subscriber-accounts';
import type { Actions, PageServerLoad } from './$types';

export const load: PageServerLoad = async () => {
	const user = requireUser();
	const account = await accounts.getAccount(user.id);
	if (!account) error(404, 'Account not found');
	const [authorRequest, subscription, choices, noticeSettings] = await Promise.all([
		authorRequests.getMine(user.id),
		subscriberAccounts.accountSubscription(user.id),
		subscribers.preferenceChoices(),
		notices.settingsOf(user.id)
	]);
	return {
		account,
		authorRequest,
		subscription,
		regions: choices.regions,
		noticeSettings,
		noticeLabels: notices.NOTICE_KIND_LABELS
	};
};

export const actions: Actions = {
	newsletter: async ({ request, url }) => {
		const user = requireUser();
		const fields = newsletterFields(await request.formData());
		const input = newsletterPreferences.safeParse(fields);
		if (!input.success)
			return fail(400, { section: 'newsletter', issues: fieldIssues(input.error) });
		const outcome = await subscriberAccounts.subscribeAccount(user.id, input.data, url.origin);
		if (outcome.kind === 'not_found') error(404, 'Account not found');
		if (outcome.kind === 'invalid')
			return fail(400, { section: 'newsletter', issues: outcome.issues });
		return {
			section: 'newsletter',
			message:
				outcome.status === 'confirmed'
					? 'Your newsletter choices are saved.'
					: 'Saved. Follow the confirmation link we sent to your address to start.'
		};
	},

	leaveNewsletter: async () => {
		const user = requireUser();
		await subscriberAccounts.unsubscribeAccount(user.id);
		return { section: 'newsletter', message: 'You are unsubscribed from guide mails.' };
	},

	notices: async ({ request }) => {
		const user = requireUser();
		const input = noticeSettingsInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { section: 'notices', issues: fieldIssues(input.error) });
		await notices.saveSettings(user.id, input.data);
		return { section: 'notices', message: 'Your notice settings are saved.' };
	},

	profile: async ({ request }) => {
		const user = requireUser();
		const input = profileInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { section: 'profile', issues: fieldIssues(input.error) });
		await accounts.updateProfile(user.id, input.data);
		return { section: 'profile', message: 'Your name is saved.' };
	},

	email: async ({ request, url }) => {
		const user = requireUser();
		const fields = formFields(await request.formData());
		if (fields.password === '') delete fields.password;
		const input = changeEmailInput.safeParse(fields);
		if (!input.success) return fail(400, { section: 'email', issues: fieldIssues(input.error) });
		// Each request may mail a link to an address of the asker's choosing (issue 12, item 12).
		const allowed = await limits.consumeAll(emailChangeChecks(user.id, input.data.newEmail));
		if (!allowed.ok) return tooManyRequests(allowed, undefined, { section: 'email' });
		const outcome = await accounts.requestEmailChange(user.id, input.data, url.origin);
		if (outcome.kind === 'wrong_password') {
			return fail(400, {
				section: 'email',
				issues: { password: ['That is not your current password.'] }
			});
		}
		if (outcome.kind === 'same_address') {
			return fail(400, {
				section: 'email',
				issues: { newEmail: ['That is already the address of this account.'] }
			});
		}
		return {
			section: 'email',
			message:
				'Check the new address: the account moves once you follow the link we sent there (within 60 minutes).'
		};
	},

	password: async ({ request }) => {
		const user = requireUser();
		const input = changePasswordInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { section: 'password', issues: fieldIssues(input.error) });
		const outcome = await accounts.changePassword(
			user.id,
			input.data.currentPassword,
			input.data.newPassword
		);
		if (outcome.kind === 'wrong_password') {
			return fail(400, {
				section: 'password',
				issues: { currentPassword: ['That is not your current password.'] }
			});
		}
		// Every session ended with the change, this one too: sign in again with the new password.
		redirect(303, '/signin?changed');
	},

	requestAuthor: async ({ request }) => {
		const user = requireUser();
		const input = authorRequestInput.safeParse(formFields(await request.formData()));
		if (!input.success) return fail(400, { section: 'author', issues: fieldIssues(input.error) });
		const outcome = await authorRequests.submit(user.id, input.data.pitch);
		if (outcome.kind === 'conflict')
			return fail(409, { section: 'author', message: outcome.message });
		if (outcome.kind !== 'ok') error(404, 'Account not found');
		return {
			section: 'author',
			message: 'Thanks. An editor will read your request; you will get an e-mail either way.'
		};
	},

	delete: async (event) => {
		const user = requireUser();
		const input = deleteAccountInput.safeParse(formFields(await event.request.formData()));
		if (!input.success || input.data.confirmEmail !== user.email) {
			return fail(400, {
				section: 'delete',
				issues: { confirmEmail: ['Type the e-mail address of this account to confirm.'] }
			});
		}
		await accounts.deleteAccount(user.id);
		await signOut(event);
		redirect(303, '/?deleted');
	}
};
