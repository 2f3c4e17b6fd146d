import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export class Setting extends Model<InferAttributes<Setting>, InferCreationAttributes<Setting>> {
	declare name: string;
	declare value: string;
}

export function initSetting(sequelize: Sequelize) {
	Setting.init(
		{
			name: { type: DataTypes.STRING(60), primaryKey: true },
			value: { type: DataTypes.TEXT, allowNull: false }
		},
		{ sequelize, tableName: 'settings', timestamps: false }
	);
}
