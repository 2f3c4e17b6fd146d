import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class AuditLog extends Model<InferAttributes<AuditLog>, InferCreationAttributes<AuditLog>> {
	declare id: CreationOptional<number>;
	declare actorId: number | null;
	declare action: string;
	declare targetType: string;
	declare targetId: string;
	declare details: string;
	declare createdAt: CreationOptional<Date>;
}

export function initAuditLog(sequelize: Sequelize) {
	AuditLog.init(
		{
			id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
			actorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			action: { type: DataTypes.STRING(40), allowNull: false },
			targetType: { type: DataTypes.STRING(40), allowNull: false },
			targetId: { type: DataTypes.STRING(64), allowNull: false },
			details: { type: DataTypes.TEXT, allowNull: false, defaultValue: '{}' },
			createdAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'audit_log', updatedAt: false }
	);
}
