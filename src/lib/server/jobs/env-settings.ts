/**
 * Reading the background workers' numeric settings from plain process.env (scripts/worker.ts
 * runs outside Vite). A value that cannot be read refuses the start rather than being guessed.
 */

/** `env[name]` as a positive number, `fallback` when unset or blank; throws on anything else. */
export function positiveSetting(env: NodeJS.ProcessEnv, name: string, fallback: number): number {
	const raw = env[name];
	if (raw === undefined || raw === '') return fallback;
	const value = Number(raw);
	if (!Number.isFinite(value) || value <= 0) throw new Error(`${name} must be a positive number`);
	return value;
}
