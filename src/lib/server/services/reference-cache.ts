/**
 * Small, rarely changed tables that every priced page reads (regions, exchange rates, the
 * active caution rules), kept in process memory so a page view does not query them again.
 *
 * Correctness comes from invalidation, not from a timer: every write through the models
 * (create, update, destroy, bulk forms, upsert) drops the cached value at once and again when
 * its transaction commits, so a read that raced the write inside the transaction cannot keep
 * the old value. Writes that bypass the models (raw SQL, another process) are not seen; the
 * product writes these tables only through the models, and tests that empty the database call
 * invalidateReferenceCaches(). A short time-to-live bounds what another app process would see.
 */
import type { ModelStatic, Model, Transaction } from 'sequelize';
import { CautionRule, FxRate, Region } from '$lib/server/db';

/** Another app process's write is seen within this long (no cross-process invalidation). */
const TTL_MS = 30_000;

interface Entry<T> {
	value: Promise<T>;
	loadedAt: number;
}

const entries = new Map<string, Entry<unknown>>();
/** Bumped on every invalidation so a load that started before it is not stored. */
let generation = 0;

/** The cached value of `key`, loading it once when absent, invalidated or older than the TTL. */
export function cached<T>(key: string, load: () => Promise<T>): Promise<T> {
	const entry = entries.get(key) as Entry<T> | undefined;
	if (entry && Date.now() - entry.loadedAt < TTL_MS) return entry.value;
	const started = generation;
	const value = load();
	entries.set(key, { value, loadedAt: Date.now() });
	value.then(
		() => {
			// A write landed while loading: the loaded value may predate it.
			if (generation !== started && entries.get(key)?.value === value) entries.delete(key);
		},
		() => {
			if (entries.get(key)?.value === value) entries.delete(key);
		}
	);
	return value;
}

/** Drops every cached reference value (after any write to a watched table). */
export function invalidateReferenceCaches(): void {
	generation++;
	entries.clear();
	for (const listener of listeners) listener();
}

const listeners = new Set<() => void>();

/** Other caches built on these tables (the guide view cache) drop with them. */
export function onReferenceChange(listener: () => void): void {
	listeners.add(listener);
}

function invalidateWith(options: { transaction?: Transaction | null } | undefined): void {
	invalidateReferenceCaches();
	options?.transaction?.afterCommit(() => invalidateReferenceCaches());
}

const HOOKS = [
	'afterCreate',
	'afterUpdate',
	'afterSave',
	'afterDestroy',
	'afterUpsert',
	'afterBulkCreate',
	'afterBulkUpdate',
	'afterBulkDestroy'
] as const;

function watch(model: ModelStatic<Model>): void {
	for (const hook of HOOKS) {
		// Instance hooks pass (instance, options); bulk hooks pass (options).
		model.addHook(hook, `reference-cache-${hook}`, (...args: unknown[]) => {
			const options = args.length > 1 ? args[1] : args[0];
			invalidateWith(options as { transaction?: Transaction | null } | undefined);
		});
	}
}

watch(Region as unknown as ModelStatic<Model>);
watch(FxRate as unknown as ModelStatic<Model>);
watch(CautionRule as unknown as ModelStatic<Model>);

/** Every region as a model row, by name; callers must not modify them. */
export function allRegions(): Promise<Region[]> {
	return cached('regions', () => Region.findAll({ order: [['name', 'ASC']] }));
}

/** The region with `code`, or null. */
export async function regionByCode(code: string): Promise<Region | null> {
	return (await allRegions()).find((r) => r.code === code) ?? null;
}

/** The region with `id`, or null. */
export async function regionById(id: number): Promise<Region | null> {
	return (await allRegions()).find((r) => r.id === id) ?? null;
}
