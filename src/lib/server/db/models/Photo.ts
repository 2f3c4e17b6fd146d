import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** One uploaded image, keyed by the sha256 of its original bytes; rows are written once and never removed. */
export class Photo extends Model<InferAttributes<Photo>, InferCreationAttributes<Photo>> {
	declare id: string;
	declare mime: string;
	declare width: number;
	declare height: number;
	declare bytes: number;
	declare uploaderId: number;
	declare createdAt: CreationOptional<Date>;
}

export function initPhoto(sequelize: Sequelize) {
	Photo.init(
		{
			id: { type: DataTypes.CHAR(64), primaryKey: true },
			mime: { type: DataTypes.STRING(40), allowNull: false },
			width: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			height: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			bytes: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			uploaderId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			createdAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'photos', updatedAt: false }
	);
}
