import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const NOTICE_MODES = ['immediate', 'digest'] as const;
export type NoticeMode = (typeof NOTICE_MODES)[number];

/** How a person hears about watched pages; a missing row means the defaults. */
export class NotificationPreference extends Model<InferAttributes<NotificationPreference>, InferCreationAttributes<NotificationPreference>> {
	declare userId: number;
	declare watchOwnEdits: CreationOptional<boolean>;
	declare noticeMode: CreationOptional<NoticeMode>;
	declare lastDigestAt: CreationOptional<Date | null>;
}

export function initNotificationPreference(sequelize: Sequelize) {
	NotificationPreference.init(
		{
			userId: { type: DataTypes.INTEGER.UNSIGNED, primaryKey: true },
			watchOwnEdits: { type: DataTypes.BOOLEAN, allowNull: false, defaultValue: true },
			noticeMode: { type: DataTypes.ENUM(...NOTICE_MODES), allowNull: false, defaultValue: 'immediate' },
			lastDigestAt: { type: DataTypes.DATE(3), allowNull: true }
		},
		{ sequelize, tableName: 'notification_preferences', timestamps: false }
	);
}
