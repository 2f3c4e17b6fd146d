import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Append-only: a revision is inserted once and never rewritten (only the `hidden` and review marks are set later). */
export class Revision extends Model<InferAttributes<Revision>, InferCreationAttributes<Revision>> {
	declare id: CreationOptional<number>;
	declare vehicleId: number;
	declare parentId: number | null;
	declare authorId: number;
	declare summary: string;
	declare content: string;
	declare rendered: string;
	declare sha256: string;
	declare size: number;
	declare sizeDelta: number;
	declare sections: string;
	declare restoresRevisionId: number | null;
	declare hidden: CreationOptional<boolean>;
	declare reviewedBy: CreationOptional<number | null>;
	declare reviewedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initRevision(sequelize: Sequelize) {
	Revision.init(
		{
			id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
			vehicleId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			parentId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			authorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			summary: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
			content: { type: DataTypes.TEXT('long'), allowNull: false },
			rendered: { type: DataTypes.TEXT('long'), allowNull: false },
			sha256: { type: DataTypes.CHAR(64), allowNull: false },
			size: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			sizeDelta: { type: DataTypes.INTEGER, allowNull: false, defaultValue: 0 },
			sections: { type: DataTypes.STRING(200), allowNull: false, defaultValue: '' },
			restoresRevisionId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			hidden: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: false },
			reviewedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			reviewedAt: { type: DataTypes.DATE(3), allowNull: true },
			createdAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'revisions', updatedAt: false }
	);
}
