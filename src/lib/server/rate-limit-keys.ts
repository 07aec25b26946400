/*
 * Which limiters guard which flow, in one place so actions stay short. The client address
 * is the socket's (adapter-node ignores X-Forwarded-For unless ADDRESS_HEADER is set for a
 * trusted proxy), so a spoofed header cannot change the key.
 */
import type { LimiterName } from './rate-limit';
import { addressKey, joinKey } from './rate-limit';

export function signInChecks(ip: string, email: string): [LimiterName, string][] {
	return [
		['signInByAddress', addressKey(ip)],
		['signInByAccountAndAddress', joinKey(addressKey(ip), email)]
	];
}

export function emailLinkChecks(ip: string, email: string): [LimiterName, string][] {
	return [
		['emailLinkByAddress', addressKey(ip)],
		['emailLinkByEmail', email]
	];
}

export function passwordResetChecks(ip: string, email: string): [LimiterName, string][] {
	return [
		['passwordResetByAddress', addressKey(ip)],
		['passwordResetByEmail', email]
	];
}

/** Price sightings count per account: signed-in only, so the account is the key. */
export function priceSightingChecks(userId: string): [LimiterName, string][] {
	return [['priceSightingByUser', userId]];
}
