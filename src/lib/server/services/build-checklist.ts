/**
 * A build's assembly checklist (docs/architecture.md "Assembly checklist"): the assembly
 * stages of the guide revision the build is based on, each with that revision's photos and
 * build-notes steps (domain/assembly-stages.ts stepsByStage), and the owner's ticks.
 *
 * The stages are read from the build's base revision, which is frozen, so the checklist is
 * the build's own copy of them. Ticks are stored per stage key (build_stage_ticks): after an
 * update from the guide moves the base revision on, every stage that still exists keeps its
 * tick; a tick on a stage the new revision dropped is no longer shown or counted.
 */
import {
	ASSEMBLY_STAGES,
	DEFER_TO_MANUALS,
	checklistProgress,
	cautionsFor,
	stepsByStage
} from '$lib/domain/assembly-stages';
import { splitBuildNotes } from '$lib/schemas/guide-editor';
import type { StageTickInput } from '$lib/schemas/photos';
import { Build, BuildStageTick, GuideRevision } from '$lib/server/db';
import { revisionGallery } from './gallery';
import type { Outcome } from '$lib/schemas/issues';
import type { ChecklistStageView, ChecklistView } from '$lib/views';

export type { ChecklistStageView, ChecklistView };

async function stagesOf(baseRevisionId: number) {
	const revision = await GuideRevision.findByPk(baseRevisionId, {
		attributes: ['id', 'buildNotesMd']
	});
	if (!revision) return null;
	const steps = stepsByStage(splitBuildNotes(revision.buildNotesMd ?? '').assembly);
	const gallery = await revisionGallery(revision.id);
	const stages = ASSEMBLY_STAGES.flatMap(({ key, label }) => {
		const photos = gallery.filter((g) => g.stage === key).map((g) => g.photo);
		const stageSteps = steps.byStage[key] ?? [];
		return photos.length || stageSteps.length
			? [{ stage: key, label, cautions: cautionsFor(key), photos, steps: stageSteps }]
			: [];
	});
	return { general: steps.general, stages };
}

/** The checklist of a build the caller may already read; null when it has no source revision. */
export async function getChecklist(buildId: number): Promise<ChecklistView | null> {
	const build = await Build.findByPk(buildId, { attributes: ['id', 'baseRevisionId'] });
	if (!build?.baseRevisionId) return null;
	const found = await stagesOf(build.baseRevisionId);
	if (!found) return null;
	const ticked = new Set(
		(await BuildStageTick.findAll({ where: { buildId }, attributes: ['stage'] })).map(
			(t) => t.stage
		)
	);
	const stages = found.stages.map((s) => ({ ...s, done: ticked.has(s.stage) }));
	return {
		general: found.general,
		stages,
		progress: checklistProgress(
			stages.map((s) => s.stage),
			ticked
		),
		deferToManuals: DEFER_TO_MANUALS
	};
}

/** Ticks or unticks one stage; the owner's only, and only a stage the checklist has. */
export async function tick(
	ownerId: string,
	buildId: number,
	input: StageTickInput
): Promise<Outcome> {
	const build = await Build.findOne({
		where: { id: buildId, ownerId },
		attributes: ['id', 'baseRevisionId']
	});
	if (!build) return { kind: 'not_found' };
	const found = build.baseRevisionId ? await stagesOf(build.baseRevisionId) : null;
	if (!found?.stages.some((s) => s.stage === input.stage))
		return { kind: 'invalid', issues: { stage: ['This build has no such assembly stage.'] } };
	if (input.done) {
		await BuildStageTick.findOrCreate({
			where: { buildId, stage: input.stage },
			defaults: { buildId, stage: input.stage, tickedAt: new Date() }
		});
	} else {
		await BuildStageTick.destroy({ where: { buildId, stage: input.stage } });
	}
	return { kind: 'ok' };
}
