import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Make extends Model<InferAttributes<Make>, InferCreationAttributes<Make>> {
	declare id: CreationOptional<number>;
	declare name: string;
	declare slug: string;
}

export class VehicleModel extends Model<InferAttributes<VehicleModel>, InferCreationAttributes<VehicleModel>> {
	declare id: CreationOptional<number>;
	declare makeId: number;
	declare name: string;
	declare slug: string;
}

export function initCatalogue(sequelize: Sequelize) {
	Make.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			name: { type: DataTypes.STRING(80), allowNull: false, unique: true },
			slug: { type: DataTypes.STRING(80), allowNull: false, unique: true }
		},
		{ sequelize, tableName: 'makes', timestamps: false }
	);
	VehicleModel.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			makeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			name: { type: DataTypes.STRING(80), allowNull: false },
			slug: { type: DataTypes.STRING(80), allowNull: false }
		},
		{ sequelize, tableName: 'models', timestamps: false }
	);
}
