import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

import { ROLES, type Role } from '../../../domain/roles';

export { ROLES, type Role };
export const USER_STATUSES = ['active', 'disabled'] as const;
export type UserStatus = (typeof USER_STATUSES)[number];

export class User extends Model<InferAttributes<User>, InferCreationAttributes<User>> {
	declare id: CreationOptional<number>;
	declare email: string;
	declare name: string;
	declare passwordHash: string | null;
	declare role: Role;
	declare status: CreationOptional<UserStatus>;
	declare units: CreationOptional<'metric' | 'imperial'>;
	declare sessionVersion: CreationOptional<number>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initUser(sequelize: Sequelize) {
	User.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			email: { type: DataTypes.STRING(254), allowNull: false, unique: true },
			name: { type: DataTypes.STRING(120), allowNull: false },
			passwordHash: { type: DataTypes.STRING(100), allowNull: true },
			role: { type: DataTypes.ENUM(...ROLES), allowNull: false, defaultValue: 'viewer' },
			status: { type: DataTypes.ENUM(...USER_STATUSES), allowNull: false, defaultValue: 'active' },
			units: { type: DataTypes.ENUM('metric', 'imperial'), allowNull: false, defaultValue: 'metric' },
			sessionVersion: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false, defaultValue: 1 },
			createdAt: DataTypes.DATE(3),
			updatedAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'users' }
	);
}
