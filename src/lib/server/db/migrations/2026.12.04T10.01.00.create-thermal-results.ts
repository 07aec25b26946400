import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, references, timestamps } from './columns.js';

/** CPU/GPU temperature (°C) and utilisation (%) of a revision's build under a named load. */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable('thermal_results', {
		id: idColumn,
		revision_id: references('guide_revisions', 'CASCADE'),
		position: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 0 },
		load_name: { type: DataTypes.STRING(120), allowNull: false },
		cpu_temp_c: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
		gpu_temp_c: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: true },
		cpu_util_pct: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
		gpu_util_pct: { type: DataTypes.TINYINT.UNSIGNED, allowNull: true },
		...timestamps
	});
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('thermal_results');
};
