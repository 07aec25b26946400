/**
 * Editors' pairing cautions: list, create, update (optimistic locking on `version`),
 * deactivate/activate and delete. Every write is checked with zod against the spec
 * schemas first, runs in one transaction and records an audit event in it. Readers of
 * fit reports get the active rules in one query (`activeRules`).
 */
import { UniqueConstraintError } from 'sequelize';
import type { Transaction } from 'sequelize';
import type {
	CautionCondition,
	CautionRule as CautionRuleData
} from '$lib/domain/pairing-cautions';
import { cautionRuleInput } from '$lib/schemas/caution-rules';
import { fieldIssues } from '$lib/schemas/issues';
import { CautionRule, User, sequelize } from '$lib/server/db';
import * as audit from './audit';
import { bumpGuideViews } from './cache-generations';
import type { Issues, Outcome } from '$lib/schemas/issues';
import * as guidePrices from './guide-prices';
import { cached } from './reference-cache';

export interface CautionRuleRow {
	id: number;
	title: string;
	message: string;
	active: boolean;
	conditions: CautionCondition[];
	authorName: string;
	version: number;
	updatedAt: string;
}

/** Shown for a rule whose author's account is gone. */
export const FORMER_EDITOR = 'Former editor';

type Loaded = CautionRule & { author?: User | null };

function toRow(rule: Loaded): CautionRuleRow {
	return {
		id: rule.id,
		title: rule.title,
		message: rule.message,
		active: rule.active,
		conditions: rule.conditions,
		authorName: rule.author?.name ?? FORMER_EDITOR,
		version: rule.version,
		updatedAt: rule.updatedAt.toISOString()
	};
}

function snapshot(rule: {
	title: string;
	message: string;
	active: boolean;
	conditions: CautionCondition[];
}) {
	return {
		title: rule.title,
		message: rule.message,
		active: rule.active,
		conditions: rule.conditions
	};
}

const authorInclude = [{ model: User, as: 'author', attributes: ['name'] }];

/** All rules, active first, then by title. Editors keep a handful, so no pagination. */
export async function listRules(): Promise<CautionRuleRow[]> {
	const rules = (await CautionRule.findAll({
		include: authorInclude,
		order: [
			['active', 'DESC'],
			['title', 'ASC'],
			['id', 'ASC']
		]
	})) as Loaded[];
	return rules.map(toRow);
}

export async function getRule(id: number): Promise<CautionRuleRow | null> {
	const rule = (await CautionRule.findByPk(id, { include: authorInclude })) as Loaded | null;
	return rule ? toRow(rule) : null;
}

/** The active rules as evaluation takes them: one query, whatever the number of rules. */
export function activeRules(): Promise<CautionRuleData[]> {
	// Read on every guide page; editors change rules rarely (reference-cache.ts invalidates).
	return cached('active-caution-rules', loadActiveRules);
}

async function loadActiveRules(): Promise<CautionRuleData[]> {
	const rules = (await CautionRule.findAll({
		where: { active: true },
		include: authorInclude,
		order: [['id', 'ASC']]
	})) as Loaded[];
	return rules.map((r) => ({
		id: r.id,
		message: r.message,
		authorName: r.author?.name ?? FORMER_EDITOR,
		conditions: r.conditions
	}));
}

function titleTaken(title: string): Issues {
	return { title: [`A rule titled "${title}" already exists; choose another title.`] };
}

async function titleInUse(
	title: string,
	exceptId: number | null,
	transaction: Transaction
): Promise<boolean> {
	const other = await CautionRule.findOne({
		where: { title },
		attributes: ['id'],
		transaction,
		lock: transaction.LOCK.UPDATE
	});
	return other !== null && other.id !== exceptId;
}

/** Adds a rule written by editor `actorId`. `raw` is the form's object (see ruleFromForm). */
async function createRuleOnly(
	actorId: string,
	raw: unknown
): Promise<Outcome<{ rule: CautionRuleRow }>> {
	const parsed = cautionRuleInput.safeParse(raw);
	if (!parsed.success) return { kind: 'invalid', issues: fieldIssues(parsed.error) };
	const input = parsed.data;
	return viewsFollow(
		uniqueTitle(input.title, () =>
			sequelize.transaction(async (transaction) => {
				if (await titleInUse(input.title, null, transaction))
					return { kind: 'invalid' as const, issues: titleTaken(input.title) };
				const rule = await CautionRule.create({ ...input, authorId: actorId }, { transaction });
				await audit.record(
					{
						actorId,
						action: 'caution_rule.created',
						subjectType: 'caution_rule',
						subjectId: rule.id,
						after: snapshot(input)
					},
					transaction
				);
				const author = await User.findByPk(actorId, { attributes: ['name'], transaction });
				return { kind: 'ok' as const, rule: toRow(Object.assign(rule, { author })) };
			})
		)
	);
}

/**
 * Saves a changed rule if nobody saved it since `expectedVersion` was read; the author
 * stays the editor who wrote it (the audit trail names who changed it).
 */
async function updateRuleOnly(
	actorId: string,
	id: number,
	expectedVersion: number,
	raw: unknown
): Promise<Outcome<{ rule: CautionRuleRow }>> {
	const parsed = cautionRuleInput.safeParse(raw);
	if (!parsed.success) return { kind: 'invalid', issues: fieldIssues(parsed.error) };
	const input = parsed.data;
	return viewsFollow(
		uniqueTitle(input.title, () =>
			sequelize.transaction(async (transaction) => {
				const rule = (await CautionRule.findByPk(id, {
					include: authorInclude,
					transaction,
					lock: transaction.LOCK.UPDATE
				})) as Loaded | null;
				if (!rule) return { kind: 'not_found' as const };
				if (rule.version !== expectedVersion) return stale();
				if (await titleInUse(input.title, id, transaction))
					return { kind: 'invalid' as const, issues: titleTaken(input.title) };
				const before = snapshot(rule);
				await rule.update({ ...input, version: rule.version + 1 }, { transaction });
				await audit.record(
					{
						actorId,
						action: 'caution_rule.updated',
						subjectType: 'caution_rule',
						subjectId: id,
						before,
						after: snapshot(input)
					},
					transaction
				);
				return { kind: 'ok' as const, rule: toRow(rule) };
			})
		)
	);
}

/** Two editors saving the same new title at once: the unique key refuses the second. */
async function uniqueTitle<T>(
	title: string,
	write: () => Promise<T>
): Promise<T | { kind: 'invalid'; issues: Issues }> {
	try {
		return await write();
	} catch (error) {
		if (error instanceof UniqueConstraintError)
			return { kind: 'invalid', issues: titleTaken(title) };
		throw error;
	}
}

function stale() {
	return {
		kind: 'conflict' as const,
		message: 'Someone changed this rule since you opened it. Reload the page to see their version.'
	};
}

/** Turns a rule off (it stays listed and can be turned on again) or on. */
async function setActiveOnly(
	actorId: string,
	id: number,
	expectedVersion: number,
	active: boolean
): Promise<Outcome> {
	return viewsFollow(
		sequelize.transaction(async (transaction) => {
			const rule = await CautionRule.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
			if (!rule) return { kind: 'not_found' as const };
			if (rule.version !== expectedVersion) return stale();
			if (rule.active === active) return { kind: 'ok' as const };
			await rule.update({ active, version: rule.version + 1 }, { transaction });
			await audit.record(
				{
					actorId,
					action: active ? 'caution_rule.activated' : 'caution_rule.deactivated',
					subjectType: 'caution_rule',
					subjectId: id,
					before: { active: !active },
					after: { active }
				},
				transaction
			);
			return { kind: 'ok' as const };
		})
	);
}

/** Deletes a rule for good; the audit event keeps what it said. */
async function deleteRuleOnly(
	actorId: string,
	id: number,
	expectedVersion: number
): Promise<Outcome> {
	return viewsFollow(
		sequelize.transaction(async (transaction) => {
			const rule = await CautionRule.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
			if (!rule) return { kind: 'not_found' as const };
			if (rule.version !== expectedVersion) return stale();
			const before = snapshot(rule);
			await rule.destroy({ transaction });
			await audit.record(
				{
					actorId,
					action: 'caution_rule.deleted',
					subjectType: 'caution_rule',
					subjectId: id,
					before
				},
				transaction
			);
			return { kind: 'ok' as const };
		})
	);
}

/**
 * Rules decide the guide page's drop-in findings: after a committed change the cached
 * guide views are dropped in every app process (guide-view-cache.ts).
 */
async function viewsFollow<T extends { kind: string }>(write: Promise<T>): Promise<T> {
	const outcome = await write;
	if (outcome.kind === 'ok') await bumpGuideViews();
	return outcome;
}

/*
 * A rule added, changed, turned on or off or deleted can flag a live guide's picks or clear
 * a flag: the guides' upkeep alerts are recomputed. That pass (guide-prices.ts) reads every
 * published guide, so it runs after the editor has their answer; the guide pages themselves
 * follow at once (viewsFollow above).
 */
async function afterChange<O extends { kind: string }>(outcome: O): Promise<O> {
	if (outcome.kind === 'ok') guidePrices.refreshAllLater();
	return outcome;
}

/** Adds a rule written by editor `actorId`. `raw` is the form's object (see ruleFromForm). */
export async function createRule(actorId: string, raw: unknown) {
	return afterChange(await createRuleOnly(actorId, raw));
}

/** Saves a changed rule if nobody saved it since `expectedVersion` was read. */
export async function updateRule(
	actorId: string,
	id: number,
	expectedVersion: number,
	raw: unknown
) {
	return afterChange(await updateRuleOnly(actorId, id, expectedVersion, raw));
}

/** Turns a rule off or on. */
export async function setActive(
	actorId: string,
	id: number,
	expectedVersion: number,
	active: boolean
) {
	return afterChange(await setActiveOnly(actorId, id, expectedVersion, active));
}

/** Deletes a rule for good. */
export async function deleteRule(actorId: string, id: number, expectedVersion: number) {
	return afterChange(await deleteRuleOnly(actorId, id, expectedVersion));
}
