/**
 * "Not now": a build owner declines the update from the guide they are offered
 * (docs/architecture.md "Update from the guide"). The decision is stored, which revision and
 * when (build_update_declines), so fork insights count owners who said no rather than
 * guessing from builds that are merely behind. The build itself does not change: its slots,
 * base revision and version stay as they are, and the offer stays on the page, folded, in
 * case the owner changes their mind (taking it later is a sync like any other).
 *
 * Owner only (another person's build is not_found); only the revision on offer now can be
 * declined (an older table is refused, so a decline is never recorded for a revision the
 * owner did not see); a repeat keeps the first answer and its time.
 */
import { QueryTypes } from 'sequelize';
import type { SyncDeclineInput } from '$lib/schemas/build-sync';
import type { Invalid, NotFound } from '$lib/schemas/issues';
import { sequelize } from '$lib/server/db';
import { inputError, loadState, ownBuild } from './build-sync-plan';

export type DeclineOutcome =
	| {
			kind: 'ok';
			/** The revision declined and the one the build stays on. */
			revisionNumber: number;
			baseRevisionNumber: number;
			declinedAt: string;
	  }
	| Invalid
	| NotFound;

const UP_TO_DATE = 'This build is already on the guide’s latest published revision.';
const STALE_OFFER =
	'A newer revision of the guide was published since this page was loaded. Look at the new offer and answer again.';

export async function declineUpdate(
	ownerId: string,
	buildId: number,
	input: SyncDeclineInput,
	now = new Date()
): Promise<DeclineOutcome> {
	try {
		return await sequelize.transaction(async (transaction): Promise<DeclineOutcome> => {
			const build = await ownBuild(ownerId, buildId, transaction);
			if (!build) return { kind: 'not_found' };
			const state = await loadState(build, transaction);
			if (state === 'up_to_date') return { kind: 'invalid', issues: { _form: [UP_TO_DATE] } };
			if (input.upstreamRevisionId !== state.upstreamRevision.id)
				return { kind: 'invalid', issues: { upstreamRevisionId: [STALE_OFFER] } };
			await sequelize.query(
				`INSERT IGNORE INTO build_update_declines (build_id, revision_id, declined_at)
				 VALUES (:buildId, :revisionId, :now)`,
				{
					type: QueryTypes.INSERT,
					replacements: { buildId: build.id, revisionId: state.upstreamRevision.id, now },
					transaction
				}
			);
			const [row] = await sequelize.query<{ declinedAt: Date }>(
				`SELECT declined_at AS declinedAt FROM build_update_declines
				  WHERE build_id = :buildId AND revision_id = :revisionId`,
				{
					type: QueryTypes.SELECT,
					replacements: { buildId: build.id, revisionId: state.upstreamRevision.id },
					transaction
				}
			);
			return {
				kind: 'ok',
				revisionNumber: state.upstreamRevision.number,
				baseRevisionNumber: state.baseRevision.number,
				declinedAt: new Date(row?.declinedAt ?? now).toISOString()
			};
		});
	} catch (e) {
		const issues = inputError(e);
		if (issues) return { kind: 'invalid', issues };
		throw e;
	}
}
