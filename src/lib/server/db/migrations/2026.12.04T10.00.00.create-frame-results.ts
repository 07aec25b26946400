import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

/** Measured frame rates of a revision's build. FPS in tenths as integers: exact, no float drift. */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('frame_results', {
		id: idColumn,
		revision_id: references('guide_revisions', 'CASCADE'),
		position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
		workload: { type: DataTypes.STRING(120), allowNull: false },
		resolution: { type: DataTypes.STRING(20), allowNull: false },
		preset: { type: DataTypes.STRING(60), allowNull: false, defaultValue: '' },
		avg_fps_tenths: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
		low1_fps_tenths: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
		notes: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
		...timestamps
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('frame_results');
};
