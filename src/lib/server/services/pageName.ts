// The name a page goes by in lists, search, the fit index, mails and its address: the make, model, years
// and body of the newest revision a viewer may read. A rename nobody has signed off yet therefore stays
// with the writers (who read it in the page itself) until a moderator signs it off.
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';
import { Make, Vehicle, VehicleModel, VehicleSlug } from '../db/models';
import { slugify, vehicleSlug } from '../../domain/slug';
import type { VehicleContent } from '../../domain/content/schema';
import type { ReadingRules } from '../../domain/visibility';
import { INDEX_READER, pageRevisionSql, readingRules } from './readingRules';
import { ServiceError } from '../errors';

type Identity = Pick<VehicleContent['identity'], 'make' | 'model' | 'yearFrom' | 'yearTo' | 'body'>;

/** Refuses a name another page already goes by (or will once its own rename is signed off). */
export async function refuseTakenName(vehicleId: number, identity: Identity, transaction: Transaction): Promise<void> {
	const slug = vehicleSlug(identity);
	const taken = await Vehicle.findOne({ where: { slug }, attributes: ['id'], transaction });
	if (taken && Number(taken.id) !== vehicleId) {
		throw new ServiceError('Another page already covers that make, model, years and body. Edit that page instead.', 409, {
			'identity.model': 'Another page already has this make, model, year range and body.'
		});
	}
}

async function catalogueIds(identity: Identity, transaction: Transaction): Promise<{ makeId: number; modelId: number }> {
	const [make] = await Make.findOrCreate({ where: { name: identity.make }, defaults: { name: identity.make, slug: slugify(identity.make) }, transaction });
	const modelSlug = slugify(identity.model);
	const [model] = await VehicleModel.findOrCreate({
		where: { makeId: make.id, slug: modelSlug },
		defaults: { makeId: make.id, name: identity.model, slug: modelSlug },
		transaction
	});
	return { makeId: make.id, modelId: model.id };
}

/** Make, model, years and body for a new page row, before its first revision exists. */
export async function namingColumns(identity: Identity, transaction: Transaction) {
	return { slug: vehicleSlug(identity), ...(await catalogueIds(identity, transaction)), yearFrom: identity.yearFrom, yearTo: identity.yearTo, body: identity.body };
}

/** The identity of the revision viewers read as the page; the newest revision when they read none yet. */
async function shownIdentity(vehicleId: number, rules: ReadingRules, transaction: Transaction): Promise<Identity | null> {
	const [row] = await db().query<{ identity: string | null }>(
		`SELECT JSON_EXTRACT(r.content, '$.identity') AS identity FROM vehicles v
		 JOIN revisions r ON r.id = COALESCE(${pageRevisionSql('v', INDEX_READER, rules)}, v.latest_revision_id)
		 WHERE v.id = :id`,
		{ replacements: { id: vehicleId }, type: QueryTypes.SELECT, transaction }
	);
	if (!row?.identity) return null;
	return typeof row.identity === 'string' ? (JSON.parse(row.identity) as Identity) : (row.identity as Identity);
}

/**
 * Moves the page row to the name viewers read; the caller holds the vehicle row lock. A name another page
 * took in the meantime is left alone (the page keeps its current name) rather than refused after the fact.
 */
export async function settlePageName(vehicle: Vehicle, transaction: Transaction, rules?: ReadingRules): Promise<void> {
	const identity = await shownIdentity(Number(vehicle.id), rules ?? (await readingRules()), transaction);
	if (!identity) return;
	const slug = vehicleSlug(identity);
	if (slug !== vehicle.slug) {
		const taken = await Vehicle.findOne({ where: { slug }, attributes: ['id'], transaction });
		if (taken && Number(taken.id) !== Number(vehicle.id)) return;
		if (vehicle.slug) await VehicleSlug.upsert({ slug: vehicle.slug, vehicleId: vehicle.id }, { transaction });
		await VehicleSlug.destroy({ where: { slug }, transaction });
	}
	const ids = await catalogueIds(identity, transaction);
	const same =
		slug === vehicle.slug &&
		ids.makeId === Number(vehicle.makeId) &&
		ids.modelId === Number(vehicle.modelId) &&
		identity.yearFrom === vehicle.yearFrom &&
		identity.yearTo === vehicle.yearTo &&
		identity.body === vehicle.body;
	if (!same) await vehicle.update({ slug, ...ids, yearFrom: identity.yearFrom, yearTo: identity.yearTo, body: identity.body }, { transaction });
}
