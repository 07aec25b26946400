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
	// No form of ours has a field named `__proto__`: assigned, it would set the object's
	// prototype; kept as an own key, the page's answer cannot be serialised (devalue refuses
	// it). It is dropped, and forms whose every field may be absent carry a required marker.
	const fields: Record<string, string> = {};
	for (const [key, value] of data)
		if (typeof value === 'string' && key !== '__proto__') fields[key] = value;
	return fields;
}
