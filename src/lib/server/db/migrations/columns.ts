/* Column helpers shared by migrations (timestamps, foreign keys), so every table agrees. */
import { DataTypes } from 'sequelize';
import type { ModelAttributeColumnOptions } from 'sequelize';

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
