import { z } from 'zod';
import { emailAddress } from './email';
import { existingPassword, newPassword } from './password';
import { redirectTarget } from './redirect-target';

export { redirectTarget } from './redirect-target';

const displayName = z
	.string()
	.trim()
	.min(1, 'Enter a name others will see.')
	.max(120, 'Use at most 120 characters.')
	.refine((n) => !/[\r\n<>]/.test(n), 'Line breaks and angle brackets are not allowed in a name.');

export const passwordSignInInput = z.strictObject({
	email: emailAddress,
	password: existingPassword,
	redirectTo: redirectTarget.optional()
});

export const linkSignInInput = z.strictObject({
	email: emailAddress,
	redirectTo: redirectTarget.optional()
});

export const signUpInput = z.strictObject({
	name: displayName,
	email: emailAddress,
	password: newPassword
});

export const passwordResetRequestInput = z.strictObject({ email: emailAddress });

export const passwordResetInput = z.strictObject({ password: newPassword });

export const tokenInput = z.strictObject({ token: z.string().min(20).max(200) });

export const profileInput = z.strictObject({ name: displayName });

export const changePasswordInput = z.strictObject({
	currentPassword: existingPassword,
	newPassword
});

export const changeEmailInput = z.strictObject({
	newEmail: emailAddress,
	// Absent for accounts that sign in by link only.
	password: existingPassword.optional()
});

export const deleteAccountInput = z.strictObject({
	confirmEmail: emailAddress
});

/** Form fields as a plain object; repeated fields keep their last value. */
export function formFields(data: FormData): Record<string, string> {
	// fromEntries defines each name as an own field; assigning `fields[key]` would turn a field
	// named `__proto__` into the object's prototype and the field would vanish unseen.
	const entries: [string, string][] = [];
	for (const [key, value] of data) if (typeof value === 'string') entries.push([key, value]);
	return Object.fromEntries(entries);
}
