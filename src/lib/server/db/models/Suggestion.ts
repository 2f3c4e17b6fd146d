import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

export const SUGGESTION_STATUSES = ['open', 'applied', 'declined'] as const;
export type SuggestionStatus = (typeof SUGGESTION_STATUSES)[number];

/** A writer's change to a locked page, waiting for a moderator; the content is JSON as a revision keeps it. */
export class Suggestion extends Model<InferAttributes<Suggestion>, InferCreationAttributes<Suggestion>> {
	declare id: CreationOptional<number>;
	declare vehicleId: number;
	declare authorId: number;
	declare baseRevisionId: number;
	declare content: string;
	declare summary: string;
	declare status: CreationOptional<SuggestionStatus>;
	declare answeredBy: CreationOptional<number | null>;
	declare answeredAt: CreationOptional<Date | null>;
	declare answerNote: CreationOptional<string>;
	declare appliedRevisionId: CreationOptional<number | null>;
	declare createdAt: CreationOptional<Date>;
}

export function initSuggestion(sequelize: Sequelize) {
	Suggestion.init(
		{
			id: { type: DataTypes.INTEGER.UNSIGNED, autoIncrement: true, primaryKey: true },
			vehicleId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			authorId: { type: DataTypes.INTEGER.UNSIGNED, allowNull: false },
			baseRevisionId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: false },
			content: { type: DataTypes.TEXT('long'), allowNull: false },
			summary: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
			status: { type: DataTypes.ENUM(...SUGGESTION_STATUSES), allowNull: false, defaultValue: 'open' },
			answeredBy: { type: DataTypes.INTEGER.UNSIGNED, allowNull: true },
			answeredAt: { type: DataTypes.DATE(3), allowNull: true },
			answerNote: { type: DataTypes.STRING(500), allowNull: false, defaultValue: '' },
			appliedRevisionId: { type: DataTypes.BIGINT.UNSIGNED, allowNull: true },
			createdAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'suggestions', updatedAt: false }
	);
}
