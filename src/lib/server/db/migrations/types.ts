import type { QueryInterface } from 'sequelize';
import type { MigrationFn } from 'umzug';

export type Migration = MigrationFn<QueryInterface>;
