import type { Sequelize } from 'sequelize';
import { initUser, User } from './User';
import { initCatalogue, Make, VehicleModel } from './Catalogue';
import { initVehicle, Vehicle, VehicleSlug } from './Vehicle';
import { initRevision, Revision } from './Revision';
import { initAuditLog, AuditLog } from './AuditLog';
import { initSetting, Setting } from './Setting';

export { User, Make, VehicleModel, Vehicle, VehicleSlug, Revision, AuditLog, Setting };
export type { Role, UserStatus } from './User';
export { ROLES } from './User';
export type { Protection } from './Vehicle';

export function initModels(sequelize: Sequelize) {
	initUser(sequelize);
	initCatalogue(sequelize);
	initVehicle(sequelize);
	initRevision(sequelize);
	initAuditLog(sequelize);
	initSetting(sequelize);

	Make.hasMany(VehicleModel, { foreignKey: 'makeId', as: 'models' });
	VehicleModel.belongsTo(Make, { foreignKey: 'makeId', as: 'make' });
	Vehicle.belongsTo(Make, { foreignKey: 'makeId', as: 'make' });
	Vehicle.belongsTo(VehicleModel, { foreignKey: 'modelId', as: 'model' });
	Vehicle.hasMany(Revision, { foreignKey: 'vehicleId', as: 'revisions' });
	Revision.belongsTo(Vehicle, { foreignKey: 'vehicleId', as: 'vehicle' });
	Revision.belongsTo(User, { foreignKey: 'authorId', as: 'author' });
	AuditLog.belongsTo(User, { foreignKey: 'actorId', as: 'actor' });
}
