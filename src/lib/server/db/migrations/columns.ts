/* Column helpers shared by migrations (timestamps, foreign keys), so every table agrees. */
import { DataTypes, QueryTypes } from 'sequelize';
import type { ModelAttributeColumnOptions, QueryInterface } from 'sequelize';

export const idColumn: ModelAttributeColumnOptions = {
	type: DataTypes.INTEGER.UNSIGNED,
	autoIncrement: true,
	primaryKey: true,
	allowNull: false
};

export const timestamps: Record<'created_at' | 'updated_at', ModelAttributeColumnOptions> = {
	created_at: { type: DataTypes.DATE, allowNull: false },
	updated_at: { type: DataTypes.DATE, allowNull: false }
};

type OnDelete = 'CASCADE' | 'RESTRICT' | 'SET NULL';

/** An unsigned integer foreign key to `table.id`. */
export function references(
	table: string,
	onDelete: OnDelete,
	allowNull = false
): ModelAttributeColumnOptions {
	return {
		type: DataTypes.INTEGER.UNSIGNED,
		allowNull,
		references: { model: table, key: 'id' },
		onDelete,
		onUpdate: 'CASCADE'
	};
}

/** A foreign key to users.id (UUIDs, see the User model). */
export function referencesUser(onDelete: OnDelete, allowNull = true): ModelAttributeColumnOptions {
	return {
		type: DataTypes.UUID,
		allowNull,
		references: { model: 'users', key: 'id' },
		onDelete,
		onUpdate: 'CASCADE'
	};
}

/**
 * Drops a column with a typed raw query: Sequelize's removeColumn issues an untyped query,
 * which the mariadb driver ≥ 3.1 rejects ("Cannot delete property 'meta'", STACK gotcha 3).
 */
export async function dropColumn(qi: QueryInterface, table: string, column: string): Promise<void> {
	await qi.sequelize.query(`ALTER TABLE \`${table}\` DROP COLUMN \`${column}\``, {
		type: QueryTypes.RAW
	});
}
