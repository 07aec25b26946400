/**
 * Model hooks that move a counter of cache_generations once a write to the model's table has
 * committed (never inside the transaction: a reader that sees the new value must also see
 * the write). Here in the models, so every process and every service that writes the table
 * moves it, whatever it has loaded; the visitors' caches (http/list-caching.ts) read it.
 */
import { QueryTypes } from 'sequelize';
import type { ModelStatic, Model, Sequelize, Transaction } from 'sequelize';
import { BUMP_SQL } from './generation-names.js';

const WRITE_HOOKS = [
	'afterSave',
	'afterDestroy',
	'afterBulkCreate',
	'afterBulkUpdate',
	'afterBulkDestroy'
] as const;

interface HookOptions {
	transaction?: Transaction | null;
	fields?: string[];
}

/**
 * After any write to `model`'s rows, bump `counter`. A save whose changed fields are all in
 * `unlisted` (columns the cached answers never show), or that changed none of `listed` when
 * that is given (the only columns they show), leaves it alone.
 */
export function bumpAfterWrites(
	model: ModelStatic<Model>,
	sequelize: Sequelize,
	counter: string,
	fields: { unlisted?: ReadonlySet<string>; listed?: ReadonlySet<string> } = {}
): void {
	const { unlisted, listed } = fields;
	for (const hook of WRITE_HOOKS) {
		model.addHook(hook, `${counter}-generation-${hook}`, (...args: unknown[]) => {
			// Instance hooks get (instance, options); bulk update and destroy get (options).
			const options = (args.length > 1 ? args[1] : args[0]) as HookOptions | undefined;
			const changed = options?.fields;
			if (changed && unlisted && changed.every((f) => unlisted.has(f))) return;
			if (changed && listed && !changed.some((f) => listed.has(f))) return;
			const bump = () =>
				sequelize
					.query(BUMP_SQL, { type: QueryTypes.INSERT, replacements: { name: counter } })
					.then(() => undefined);
			if (options?.transaction) options.transaction.afterCommit(bump);
			else return bump();
		});
	}
}
