/*
 * Which limiters guard which flow, in one place so actions stay short. The client address
 * is the socket's (adapter-node ignores X-Forwarded-For unless ADDRESS_HEADER is set for a
 * trusted proxy), so a spoofed header cannot change the key.
 */
import type { LimiterName } from './rate-limit';
import { addressKey, joinKey } from './rate-limit';

/**
 * Sign-in attempts are counted before the password is checked (so parallel guesses cannot
 * slip past the count) and given back when it was right. The account+address pair comes
 * first: when it refuses, a burst of guesses at one account spends nothing of the address's
 * budget over all accounts.
 */
export function signInChecks(ip: string, email: string): [LimiterName, string][] {
	return [
		['signInByAccountAndAddress', joinKey(addressKey(ip), email)],
		['signInByAddress', addressKey(ip)]
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

/** A change of address: per account, and per new address (several accounts, one victim). */
export function emailChangeChecks(userId: string, newEmail: string): [LimiterName, string][] {
	return [
		['emailChangeByUser', userId],
		['emailChangeByEmail', newEmail]
	];
}

/** Forks count per account (the form action and the JSON API alike). */
export function forkChecks(userId: string): [LimiterName, string][] {
	return [['forkByUser', userId]];
}

/** New guides count per author (the form action and the JSON API alike). */
export function guideCreateChecks(userId: string): [LimiterName, string][] {
	return [['guideCreateByUser', userId]];
}

/** Photo uploads count per account (services/photos.ts; every upload route is signed-in only). */
export function photoUploadChecks(userId: string): [LimiterName, string][] {
	return [['photoUploadByUser', userId]];
}

/** Tips count per account: each one opens a checkout session at the payment provider. */
export function tipChecks(userId: string): [LimiterName, string][] {
	return [['tipByUser', userId]];
}
