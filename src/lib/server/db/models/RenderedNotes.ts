import { DataTypes, Model, type CreationOptional, type InferAttributes, type InferCreationAttributes, type Sequelize } from 'sequelize';

/** A page's notes as safe HTML, kept by content digest and renderer version; revisions with equal content share one row. */
export class RenderedNotesRow extends Model<InferAttributes<RenderedNotesRow>, InferCreationAttributes<RenderedNotesRow>> {
	declare sha256: string;
	declare rendererVersion: number;
	declare notes: string;
	declare createdAt: CreationOptional<Date>;
}

export function initRenderedNotes(sequelize: Sequelize) {
	RenderedNotesRow.init(
		{
			sha256: { type: DataTypes.CHAR(64), primaryKey: true },
			rendererVersion: { type: DataTypes.SMALLINT.UNSIGNED, primaryKey: true },
			notes: { type: DataTypes.TEXT('long'), allowNull: false },
			createdAt: DataTypes.DATE(3)
		},
		{ sequelize, tableName: 'rendered_notes', updatedAt: false }
	);
}
