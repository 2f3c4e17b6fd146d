import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A moderator stops someone editing until a date; lifting it early keeps the row for the record. */
export class Block extends Model<InferAttributes<Block>, InferCreationAttributes<Block>> {
	declare id: CreationOptional<number>;
	declare userId: number;
	declare byId: number;
	declare reason: string;
	declare until: Date;
	declare createdAt: CreationOptional<Date>;
	declare liftedAt: CreationOptional<Date | null>;
	declare liftedBy: CreationOptional<number | null>;
}

export function initBlock(sequelize: Sequelize) {
	Block.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			byId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			reason: { type: DataTypes.STRING(500), allowNull: false },
			until: { type: DataTypes.DATE(3), allowNull: false },
			createdAt: DataTypes.DATE(3),
			liftedAt: { type: DataTypes.DATE(3), allowNull: true },
			liftedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true }
		},
		{ sequelize, tableName: 'blocks', updatedAt: false }
	);
}
