import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { PART_KINDS, type PartKind } from '../../../domain/part';

/**
 * A product in the shop's catalogue; `specs` holds the kind's own figures as JSON (an amplifier's rated
 * power at each load, minimum load and bridging; a speaker's voice coils), read back through the part schema.
 */
export class Part extends Model<InferAttributes<Part>, InferCreationAttributes<Part>> {
	declare id: CreationOptional<number>;
	declare kind: PartKind;
	declare sku: string;
	declare name: string;
	declare lengthMm: number | null;
	declare widthMm: number | null;
	declare heightMm: number | null;
	declare specs: string;
	declare notes: string;
	declare createdBy: number | null;
	declare updatedBy: number | null;
	declare createdAt: CreationOptional<Date>;
	declare updatedAt: CreationOptional<Date>;
}

export function initPart(sequelize: Sequelize) {
	Part.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			kind: { type: DataTypes.ENUM(...PART_KINDS), allowNull: false },
			sku: { type: DataTypes.STRING(60), allowNull: false, unique: true },
			name: { type: DataTypes.STRING(160), allowNull: false },
			lengthMm: { type: DataTypes.DOUBLE, allowNull: true },
			widthMm: { type: DataTypes.DOUBLE, allowNull: true },
			heightMm: { type: DataTypes.DOUBLE, allowNull: true },
			specs: { type: DataTypes.TEXT, allowNull: false },
			notes: { type: DataTypes.TEXT, allowNull: false },
			createdBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			updatedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			createdAt: DataTypes.DATE(3),
			updatedAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'parts' }
	);
}
