import { DataTypes, Model, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A session ended by signing out; kept until its cookie would have expired anyway. */
export class EndedSession extends Model<InferAttributes<EndedSession>, InferCreationAttributes<EndedSession>> {
	declare sessionId: string;
	declare userId: number;
	declare expiresAt: Date;
}

export function initEndedSession(sequelize: Sequelize) {
	EndedSession.init(
		{
			sessionId: { type: DataTypes.CHAR(36), primaryKey: true },
			userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			expiresAt: { type: DataTypes.DATE(3), allowNull: false }
		},
		{ sequelize, tableName: 'ended_sessions', timestamps: false }
	);
}
