import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';
import { ROLES, type Role } from '../../../domain/roles';

export const TOKEN_KINDS = ['invite', 'reset', 'setup'] as const;
export type TokenKind = (typeof TOKEN_KINDS)[number];

/**
 * A single-use link: an invitation (by e-mail, with a role), a password reset (for a user), or the setup link
 * that makes the first admin of an empty install.
 */
export class AccountToken extends Model<InferAttributes<AccountToken>, InferCreationAttributes<AccountToken>> {
	declare id: CreationOptional<number>;
	declare kind: TokenKind;
	declare userId: number | null;
	declare email: string | null;
	declare role: Role | null;
	declare invitedBy: number | null;
	declare tokenHash: string;
	declare expiresAt: Date;
	declare usedAt: CreationOptional<Date | null>;
	declare revokedAt: CreationOptional<Date | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initAccountToken(sequelize: Sequelize) {
	AccountToken.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			kind: { type: DataTypes.ENUM(...TOKEN_KINDS), allowNull: false },
			userId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			email: { type: DataTypes.STRING(254), allowNull: true },
			role: { type: DataTypes.ENUM(...ROLES), allowNull: true },
			invitedBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			tokenHash: { type: DataTypes.CHAR(64), allowNull: false, unique: true },
			expiresAt: { type: DataTypes.DATE(3), allowNull: false },
			usedAt: { type: DataTypes.DATE(3), allowNull: true },
			revokedAt: { type: DataTypes.DATE(3), allowNull: true },
			createdAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'account_tokens', updatedAt: false }
	);
}
