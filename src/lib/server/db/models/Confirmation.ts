import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const TRUST_KINDS = ['confirm', 'flag'] as const;
export type TrustKind = (typeof TRUST_KINDS)[number];

/** An installer's mark on one revision of a page: "fitted as described", or a field flagged as wrong. */
export class Confirmation extends Model<InferAttributes<Confirmation>, InferCreationAttributes<Confirmation>> {
	declare id: CreationOptional<number>;
	declare vehicleId: number;
	declare revisionId: number;
	declare userId: number;
	declare kind: TrustKind;
	declare fieldPath: string | null;
	declare note: string;
	declare createdAt: CreationOptional<Date>;
}

export function initConfirmation(sequelize: Sequelize) {
	Confirmation.init(
		{
			id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
			vehicleId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			revisionId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			kind: { type: DataTypes.ENUM(...TRUST_KINDS), allowNull: false },
			fieldPath: { type: DataTypes.STRING(200), allowNull: true },
			note: { type: DataTypes.STRING(1000), allowNull: false, defaultValue: '' },
			createdAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'confirmations', updatedAt: false }
	);
}
