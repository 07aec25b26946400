/**
 * Fork insights (issue 19): what readers do with a guide once they fork it, for its author
 * and editors only (anyone else: not_found, as if there were nothing).
 *
 * Per build it compares each slot of the revision the build is based on now (by slot key)
 * with the build's slot carrying that source key: the pick kept, an alternate chosen (by
 * rank), another part, or the slot removed. Counts are of builds, private ones included,
 * and only ever shown in aggregate: a count from 1 to 4 is shown as "fewer than 5" so no
 * reader's choices can be singled out (k-anonymity style, k = 5).
 *
 * Definitions:
 * - forked from: the revision a build was first made from (its first sync's "from", else
 *   its base revision);
 * - took an update: the build has a sync with the guide that is not undone;
 * - declined: the owner answered "Not now" to an offered revision (build_update_declines,
 *   build-declines.ts) and the build has not since moved to that revision or a newer one (a
 *   build that declined and later took the update counts as taking it). A build that is
 *   merely behind, whose owner never answered, counts as neither;
 * - marked bought: the owner marked at least one part bought.
 * - suggestion: a part that at least 20 % of the slot's builds, and at least 5, swapped to.
 */
import { QueryTypes } from 'sequelize';
import { buildCount, shownCount, suggested } from '$lib/domain/insights';
import { coverTable } from '$lib/domain/table-cover';
import type { SessionUser } from '$lib/server/auth/guards';
import { Build, BuildSlot, Guide, GuideRevision, Part, Region, sequelize } from '$lib/server/db';
import type { NotFound } from '$lib/schemas/issues';
import type { GuideInsights, InsightChoice, InsightSlot } from '$lib/views';
import { loadRevisionSlots, type LoadedRevisionSlot } from './revision-snapshots';
import { partName } from './mappers';

type ChoiceKey = string;
interface Tally {
	counts: Map<ChoiceKey, number>;
	total: number;
}

interface BuildRow {
	id: number;
	baseRevisionId: number | null;
	regionId: number;
}

export async function guideInsights(
	viewer: SessionUser | null,
	slug: string
): Promise<({ kind: 'ok' } & { insights: GuideInsights }) | NotFound> {
	if (!viewer) return { kind: 'not_found' };
	const guide = await Guide.findOne({ where: { slug } });
	if (!guide) return { kind: 'not_found' };
	const staff = viewer.role === 'editor' || viewer.role === 'admin';
	if (!staff && guide.authorId !== viewer.id) return { kind: 'not_found' };

	const builds = (await Build.findAll({
		where: { sourceGuideId: guide.id },
		attributes: ['id', 'baseRevisionId', 'regionId'],
		raw: true
	})) as BuildRow[];
	const buildIds = builds.map((b) => b.id);
	const [syncs, bought, revisions, regions] = await Promise.all([
		buildIds.length === 0
			? []
			: sequelize.query<{ buildId: number; fromRevisionId: number | null; undoneAt: Date | null }>(
					`SELECT build_id AS buildId, from_revision_id AS fromRevisionId, undone_at AS undoneAt
					   FROM build_syncs WHERE build_id IN (:ids) ORDER BY id ASC`,
					{ type: QueryTypes.SELECT, replacements: { ids: buildIds } }
				),
		buildIds.length === 0
			? []
			: BuildSlot.findAll({
					where: { buildId: buildIds, purchased: true },
					attributes: ['buildId'],
					group: ['buildId'],
					raw: true
				}),
		GuideRevision.findAll({
			where: { guideId: guide.id },
			attributes: ['id', 'number'],
			raw: true
		}),
		Region.findAll({ attributes: ['id', 'code'], raw: true })
	]);

	const forkedFrom = new Map<number, number | null>();
	const took = new Set<number>();
	for (const s of syncs) {
		if (!forkedFrom.has(Number(s.buildId))) forkedFrom.set(Number(s.buildId), s.fromRevisionId);
		if (!s.undoneAt) took.add(Number(s.buildId));
	}
	const numberOf = new Map(revisions.map((r) => [r.id, r.number]));
	const perRevision = new Map<number, number>();
	for (const b of builds) {
		const from = forkedFrom.has(b.id) ? forkedFrom.get(b.id) : b.baseRevisionId;
		if (from) perRevision.set(from, (perRevision.get(from) ?? 0) + 1);
	}
	const revisionRows = [...perRevision]
		.map(([id, n]) => ({ revisionNumber: numberOf.get(id) ?? 0, n }))
		.sort((a, b) => a.revisionNumber - b.revisionNumber);
	const revisionCover = coverTable([revisionRows.map((r) => r.n)]);
	const declined = buildIds.length === 0 ? 0 : await standingDeclines(guide.id);

	const slots = await slotInsights(guide, builds, new Map(regions.map((r) => [r.id, r.code])));
	return {
		kind: 'ok',
		insights: {
			guide: { slug: guide.slug, title: guide.title },
			// Hidden when the per-revision table hides its total, and always from 1 to 4; 0 shows.
			totalBuilds: shownCount(
				builds.length,
				revisionCover.grandTotal || buildCount(builds.length).fewerThan5
			),
			perRevision: revisionRows.map((r, j) => ({
				revisionNumber: r.revisionNumber,
				builds: shownCount(r.n, revisionCover.cells[0]?.[j] ?? true)
			})),
			tookUpdate: buildCount(took.size),
			declinedUpdate: buildCount(declined),
			markedBought: buildCount(bought.length),
			slots
		}
	};
}

/** Builds of the guide with a decline whose revision is newer than the build's base now. */
async function standingDeclines(guideId: number): Promise<number> {
	const [row] = await sequelize.query<{ n: number }>(
		`SELECT COUNT(DISTINCT d.build_id) AS n
		   FROM build_update_declines d
		   JOIN builds b ON b.id = d.build_id
		   JOIN guide_revisions declined ON declined.id = d.revision_id
		   LEFT JOIN guide_revisions base ON base.id = b.base_revision_id
		  WHERE b.source_guide_id = :guideId
		    AND (base.id IS NULL OR base.number < declined.number)`,
		{ type: QueryTypes.SELECT, replacements: { guideId } }
	);
	return Number(row?.n ?? 0);
}

async function slotInsights(
	guide: Guide,
	builds: BuildRow[],
	regionCode: Map<number, string>
): Promise<InsightSlot[]> {
	const revisionIds = [
		...new Set(
			[guide.publishedRevisionId, ...builds.map((b) => b.baseRevisionId)].filter(
				(id): id is number => id !== null
			)
		)
	];
	const revisionSlots = await loadRevisionSlots(revisionIds);
	const slotOf = new Map<string, LoadedRevisionSlot>();
	for (const s of revisionSlots) slotOf.set(`${s.revisionId}|${s.slotKey}`, s);
	const buildSlots =
		builds.length === 0
			? []
			: await BuildSlot.findAll({
					where: { buildId: builds.map((b) => b.id) },
					attributes: ['buildId', 'sourceSlotKey', 'partId'],
					raw: true
				});
	const partsInBuilds = new Map<string, number>();
	for (const s of buildSlots)
		if (s.sourceSlotKey) partsInBuilds.set(`${s.buildId}|${s.sourceSlotKey}`, s.partId);
	const otherParts = new Map(
		(
			await Part.findAll({
				where: { id: [...new Set(buildSlots.map((s) => s.partId))] },
				attributes: ['id', 'slug', 'brand', 'model']
			})
		).map((p) => [p.id, p])
	);

	// The live revision's slots are the rows; each build is judged against its own base revision.
	const rows = revisionSlots.filter((s) => s.revisionId === guide.publishedRevisionId);
	return rows.map((row) => {
		const overall: Tally = { counts: new Map(), total: 0 };
		const byRegion = new Map<number, Tally>();
		const alternateRank = new Map<string, number>();
		for (const b of builds) {
			const slot = b.baseRevisionId ? slotOf.get(`${b.baseRevisionId}|${row.slotKey}`) : null;
			if (!slot) continue;
			const partId = partsInBuilds.get(`${b.id}|${row.slotKey}`);
			let key: ChoiceKey;
			if (partId === undefined) key = 'removed';
			else if (partId === slot.pickPartId) key = 'pick';
			else {
				const alt = slot.alternates.find((a) => a.partId === partId);
				key = alt ? `alternate:${partId}` : `other:${partId}`;
				if (alt) alternateRank.set(key, alt.rank);
			}
			add(overall, key);
			const tally = byRegion.get(b.regionId) ?? { counts: new Map(), total: 0 };
			add(tally, key);
			byRegion.set(b.regionId, tally);
		}
		// Regions × choices, hidden where a small count could otherwise be worked out.
		const keys = [...overall.counts.keys()];
		const regions = [...byRegion].sort(([a], [b]) =>
			(regionCode.get(a) ?? '?').localeCompare(regionCode.get(b) ?? '?')
		);
		const cover = coverTable(regions.map(([, t]) => keys.map((k) => t.counts.get(k) ?? 0)));
		const describe = (counts: number[], hidden: boolean[], total: number, totalHidden: boolean) =>
			choices(
				keys.flatMap((key, j) => {
					const n = counts[j] ?? 0;
					return n === 0 ? [] : [{ key, n, hidden: hidden[j] ?? true }];
				}),
				totalHidden ? null : total,
				row,
				alternateRank,
				otherParts
			);
		const overallCounts = keys.map((k) => overall.counts.get(k) ?? 0);
		const hiddenSum = overallCounts.reduce((s, n, j) => (cover.columnTotals[j] ? s + n : s), 0);
		// Fewer than 5 builds in all: not even the choices are named.
		const tiny = overall.total < 5;
		return {
			slotKey: row.slotKey,
			label: row.label,
			builds: shownCount(overall.total, cover.grandTotal),
			choices: tiny
				? []
				: describe(overallCounts, cover.columnTotals, overall.total, cover.grandTotal),
			hiddenShare:
				tiny || cover.grandTotal || hiddenSum === 0
					? null
					: Math.round((hiddenSum * 100) / overall.total),
			byRegion: tiny
				? []
				: regions.map(([id, t], i) => ({
						regionCode: regionCode.get(id) ?? '?',
						builds: shownCount(t.total, cover.rowTotals[i] ?? true),
						choices: cover.unlistedRows[i]
							? []
							: describe(
									keys.map((k) => t.counts.get(k) ?? 0),
									cover.cells[i] ?? [],
									t.total,
									cover.rowTotals[i] ?? true
								)
					})),
			// A part the live revision already offers is no suggestion, whatever older builds did.
			suggestions: keys.flatMap((key, j) => {
				const n = overallCounts[j] ?? 0;
				if (!key.startsWith('other:') || !suggested(n, overall.total)) return [];
				const part = otherParts.get(Number(key.slice('other:'.length)));
				if (!part || part.id === row.pickPartId) return [];
				if (row.alternates.some((a) => a.partId === part.id)) return [];
				const hidden = cover.columnTotals[j] ?? true;
				return [
					{
						partName: partName(part),
						partSlug: part.slug,
						builds: hidden ? null : n,
						percent: hidden ? null : Math.round((n * 100) / overall.total),
						editorHref: `/my/guides/${guide.slug}/edit?slot=${encodeURIComponent(row.slotKey)}&alternate=${encodeURIComponent(part.slug)}#slot-${encodeURIComponent(row.slotKey)}`
					}
				];
			})
		};
	});
}

function add(tally: Tally, key: ChoiceKey): void {
	tally.counts.set(key, (tally.counts.get(key) ?? 0) + 1);
	tally.total++;
}

const KIND_ORDER = { pick: 0, alternate: 1, other: 2, removed: 3 } as const;

function choices(
	counts: { key: ChoiceKey; n: number; hidden: boolean }[],
	total: number | null,
	slot: LoadedRevisionSlot,
	ranks: Map<string, number>,
	parts: Map<number, Part>
): InsightChoice[] {
	const out: InsightChoice[] = [];
	for (const { key, n, hidden } of counts) {
		const builds = shownCount(n, hidden);
		const percent = hidden || total === null ? null : Math.round((n * 100) / total);
		const [kind, id] = key.split(':') as [InsightChoice['kind'], string | undefined];
		const part =
			kind === 'pick' ? slot.pick : kind === 'removed' ? null : (parts.get(Number(id)) ?? null);
		out.push({
			kind,
			partName: part ? partName(part) : null,
			partSlug: part?.slug ?? null,
			rank: ranks.get(key) ?? null,
			builds,
			percent
		});
	}
	return out.sort(
		(a, b) =>
			KIND_ORDER[a.kind] - KIND_ORDER[b.kind] ||
			(a.rank ?? 0) - (b.rank ?? 0) ||
			(b.builds.count ?? 0) - (a.builds.count ?? 0) ||
			(a.partName ?? '').localeCompare(b.partName ?? '')
	);
}
