/*
 * Claiming rows of a MariaDB job table with a lease, shared by the mail queue
 * (mail/queue/worker.ts) and photo processing (images/photo-jobs.ts). In one short
 * transaction, SELECT … FOR UPDATE SKIP LOCKED picks due rows no other worker holds, and
 * UPDATE stamps them with this claim's attempt id and a lease end. The claim commits before
 * any work starts, so every later write can name the attempt id (`WHERE id AND attempt_id`)
 * and a worker whose lease ran out can no longer touch a row someone else has since claimed.
 * Relative imports and plain process.env only: scripts and workers outside Vite use it.
 */
import { randomUUID } from 'node:crypto';
import { QueryTypes, type Sequelize, type Transaction } from 'sequelize';

export interface LeaseClaim {
	/** Table with `id`, `attempt_id`, `lease_until` and `updated_at` columns. */
	table: string;
	/** SQL condition for a row that may be claimed now. */
	due: string;
	order: string;
	limit: number;
	leaseMs: number;
	/** Extra `column = expression` pairs for the claiming UPDATE (e.g. a new status). */
	set?: string;
	replacements?: Record<string, unknown>;
}

export interface Claim<Row> {
	attemptId: string;
	/** Local clock when the claim was taken (before the lease started in the database). */
	claimedAt: number;
	rows: Row[];
}

/**
 * Claims up to `limit` due rows; `read` loads what the worker needs inside the same
 * transaction, so the rows it sees are the ones it claimed.
 */
export async function claimWithLease<Row>(
	sequelize: Sequelize,
	claim: LeaseClaim,
	read: (ids: number[], transaction: Transaction) => Promise<Row[]>
): Promise<Claim<Row>> {
	const attemptId = randomUUID();
	const claimedAt = Date.now();
	const rows = await sequelize.transaction(async (transaction) => {
		const ids = await sequelize.query<{ id: number }>(
			`SELECT id FROM ${claim.table} WHERE ${claim.due}
			 ORDER BY ${claim.order} LIMIT :limit FOR UPDATE SKIP LOCKED`,
			{
				type: QueryTypes.SELECT,
				transaction,
				replacements: { ...claim.replacements, limit: claim.limit }
			}
		);
		if (ids.length === 0) return [];
		const idList = ids.map((r) => Number(r.id));
		await sequelize.query(
			`UPDATE ${claim.table} SET ${claim.set ? `${claim.set}, ` : ''}attempt_id = :attemptId,
			 lease_until = UTC_TIMESTAMP(3) + INTERVAL :leaseUs MICROSECOND, updated_at = UTC_TIMESTAMP(3)
			 WHERE id IN (:ids)`,
			{
				type: QueryTypes.UPDATE,
				transaction,
				replacements: {
					...claim.replacements,
					attemptId,
					leaseUs: Math.round(claim.leaseMs * 1000),
					ids: idList
				}
			}
		);
		return read(idList, transaction);
	});
	return { attemptId, claimedAt, rows };
}
