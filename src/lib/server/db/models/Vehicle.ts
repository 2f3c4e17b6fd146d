import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const PROTECTIONS = ['none', 'moderators'] as const;
export type Protection = (typeof PROTECTIONS)[number];

export class Vehicle extends Model<InferAttributes<Vehicle>, InferCreationAttributes<Vehicle>> {
	declare id: CreationOptional<number>;
	declare slug: string;
	declare makeId: number;
	declare modelId: number;
	declare yearFrom: number;
	declare yearTo: number;
	declare body: string;
	declare latestRevisionId: number | null;
	declare protection: CreationOptional<Protection>;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

/** Slugs a vehicle was known by before its identity changed; they redirect. */
export class VehicleSlug extends Model<InferAttributes<VehicleSlug>, InferCreationAttributes<VehicleSlug>> {
	declare slug: string;
	declare vehicleId: number;
}

export function initVehicle(sequelize: Sequelize) {
	Vehicle.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			slug: { type: DataTypes.STRING(160), allowNull: false, unique: true },
			makeId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			modelId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			yearFrom: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
			yearTo: { type: DataTypes.SMALLINT.UNSIGNED, allowNull: false },
			body: { type: DataTypes.STRING(20), allowNull: false },
			latestRevisionId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			protection: { type: DataTypes.ENUM('none', 'moderators'), allowNull: false, defaultValue: 'none' },
			createdAt: DataTypes.DATE(3),
			updatedAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'vehicles' }
	);
	VehicleSlug.init(
		{
			slug: { type: DataTypes.STRING(160), primaryKey: true },
			vehicleId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false }
		},
		{ sequelize, tableName: 'vehicle_slugs', timestamps: false }
	);
}
