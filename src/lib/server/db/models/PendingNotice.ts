import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { NOTICE_MODES, type NoticeMode } from './NotificationPreference';

/** A change a watcher has yet to hear about: sent at once, or gathered into the daily digest. */
export class PendingNotice extends Model<InferAttributes<PendingNotice>, InferCreationAttributes<PendingNotice>> {
	declare id: CreationOptional<number>;
	declare userId: number;
	declare vehicleId: number;
	declare revisionId: number;
	declare mode: NoticeMode;
	declare createdAt: CreationOptional<Date>;
	declare sentAt: CreationOptional<Date | null>;
}

export function initPendingNotice(sequelize: Sequelize) {
	PendingNotice.init(
		{
			id: { type: DataTypes.BIGINT.UNSIGNED, autoIncrement: true, primaryKey: true },
			userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			vehicleId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			revisionId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			mode: { type: DataTypes.ENUM(...NOTICE_MODES), allowNull: false },
			createdAt: DataTypes.DATE(3),
			sentAt: { type: DataTypes.DATE(3), allowNull: true }
		},
		{ sequelize, tableName: 'pending_notices', updatedAt: false }
	);
}
