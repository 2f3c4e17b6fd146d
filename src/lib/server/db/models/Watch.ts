import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** Someone follows a vehicle page and hears about its changes. */
export class Watch extends Model<InferAttributes<Watch>, InferCreationAttributes<Watch>> {
	declare id: CreationOptional<number>;
	declare userId: number;
	declare vehicleId: number;
	declare createdAt: CreationOptional<Date>;
}

export function initWatch(sequelize: Sequelize) {
	Watch.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			vehicleId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			createdAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'watches', updatedAt: false }
	);
}
