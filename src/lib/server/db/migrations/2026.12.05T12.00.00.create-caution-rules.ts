import { DataTypes } from 'sequelize';
import type { Migration } from '../umzug.js';
import { idColumn, referencesUser, timestamps } from './columns.js';

/*
 * Editors' pairing cautions (domain/pairing-cautions.ts). The title is the natural key
 * (the demo seeder finds its rules by it); the unique key is part of the one CREATE TABLE.
 */
export const up: Migration = async ({ context: qi }) => {
	await qi.createTable(
		'caution_rules',
		{
			id: idColumn,
			title: { type: DataTypes.STRING(120), allowNull: false },
			message: { type: DataTypes.TEXT, allowNull: false },
			active: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
			conditions: { type: DataTypes.JSON, allowNull: false },
			// SET NULL: a rule stays when its author's account is deleted ("Former editor").
			author_id: referencesUser('SET NULL'),
			version: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			...timestamps
		},
		{ uniqueKeys: { caution_rules_title: { fields: ['title'], customIndex: true } } }
	);
};

export const down: Migration = async ({ context: qi }) => {
	await qi.dropTable('caution_rules');
};
