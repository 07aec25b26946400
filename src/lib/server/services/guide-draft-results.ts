/**
 * A revision's measured results (frame rates and thermals), written with its working copy:
 * replaced from the editor's input, or copied from the frozen revision into the next one.
 */
import type { Transaction } from 'sequelize';
import {
	fpsToTenths,
	type FrameResultInput,
	type ThermalResultInput
} from '$lib/schemas/guide-editor';
import { FrameResult, ThermalResult } from '$lib/server/db';

/** Replaces the revision's frame results with the input's rows, in input order. */
export async function replaceFrames(
	revisionId: number,
	frames: FrameResultInput[],
	transaction: Transaction
): Promise<void> {
	await FrameResult.destroy({ where: { revisionId }, transaction });
	if (frames.length === 0) return;
	await FrameResult.bulkCreate(
		frames.map((f, i) => ({
			revisionId,
			position: i + 1,
			workload: f.workload,
			resolution: f.resolution,
			preset: f.preset,
			avgFpsTenths: fpsToTenths(f.avgFps),
			low1FpsTenths: f.low1Fps === null ? null : fpsToTenths(f.low1Fps),
			notes: f.notes
		})),
		{ transaction }
	);
}

/** Replaces the revision's thermal results with the input's rows, in input order. */
export async function replaceThermals(
	revisionId: number,
	thermals: ThermalResultInput[],
	transaction: Transaction
): Promise<void> {
	await ThermalResult.destroy({ where: { revisionId }, transaction });
	if (thermals.length === 0) return;
	await ThermalResult.bulkCreate(
		thermals.map((t, i) => ({
			revisionId,
			position: i + 1,
			loadName: t.loadName,
			cpuTempC: t.cpuTempC,
			gpuTempC: t.gpuTempC,
			cpuUtilPct: t.cpuUtilPct,
			gpuUtilPct: t.gpuUtilPct
		})),
		{ transaction }
	);
}

/** Copies a frozen revision's results into a new revision (fresh rows, same order). */
export async function copyResults(
	fromId: number,
	toId: number,
	which: { frames: boolean; thermals: boolean },
	transaction: Transaction
): Promise<void> {
	const order: [string, string][] = [
		['position', 'ASC'],
		['id', 'ASC']
	];
	if (which.frames) {
		const rows = await FrameResult.findAll({ where: { revisionId: fromId }, order, transaction });
		if (rows.length > 0) {
			await FrameResult.bulkCreate(
				rows.map((f) => ({
					revisionId: toId,
					position: f.position,
					workload: f.workload,
					resolution: f.resolution,
					preset: f.preset,
					avgFpsTenths: f.avgFpsTenths,
					low1FpsTenths: f.low1FpsTenths,
					notes: f.notes
				})),
				{ transaction }
			);
		}
	}
	if (which.thermals) {
		const rows = await ThermalResult.findAll({ where: { revisionId: fromId }, order, transaction });
		if (rows.length > 0) {
			await ThermalResult.bulkCreate(
				rows.map((t) => ({
					revisionId: toId,
					position: t.position,
					loadName: t.loadName,
					cpuTempC: t.cpuTempC,
					gpuTempC: t.gpuTempC,
					cpuUtilPct: t.cpuUtilPct,
					gpuUtilPct: t.gpuUtilPct
				})),
				{ transaction }
			);
		}
	}
}
