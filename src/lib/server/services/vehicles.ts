import { Op, QueryTypes, literal } from 'sequelize';
import { db } from '../db';
import type { Reader } from '../../domain/visibility';
import { pageOpenSql, readingRules } from './readingRules';
import { Make, Vehicle, VehicleModel, VehicleSlug } from '../db/models';
import { vehicleTitle } from '../../domain/slug';
import { ServiceError } from '../errors';
import { onRevisionWritten, onVehicleChanged } from '../events';
import { SHARED_STATE_TTL_MS, lookupCache } from '../cache';

export type VehicleSummary = {
	id: number;
	slug: string;
	make: string;
	model: string;
	yearFrom: number;
	yearTo: number;
	body: string;
	title: string;
	latestRevisionId: number | null;
	protection: 'none' | 'moderators';
};

const INCLUDE_NAMES = [
	{ model: Make, as: 'make', attributes: ['name', 'slug'] },
	{ model: VehicleModel, as: 'model', attributes: ['name', 'slug'] }
];

function summary(v: Vehicle): VehicleSummary {
	const withNames = v as Vehicle & { make: Make; model: VehicleModel };
	const base = { make: withNames.make.name, model: withNames.model.name, yearFrom: v.yearFrom, yearTo: v.yearTo };
	return {
		id: v.id,
		slug: v.slug,
		...base,
		body: v.body,
		title: vehicleTitle(base),
		latestRevisionId: v.latestRevisionId === null ? null : Number(v.latestRevisionId),
		protection: v.protection
	};
}

export type VehicleLookup = { vehicle: VehicleSummary } | { redirectTo: string } | null;

/** A page by its slug; a slug it was known by before an identity change answers with the current one. */
// Page rows are read on every view; this process's writes clear them, other instances' within the time limit.
const bySlug = lookupCache<string, VehicleLookup>(SHARED_STATE_TTL_MS);
onRevisionWritten(() => bySlug.clear());
onVehicleChanged(() => bySlug.clear());

export async function vehicleBySlug(slug: string): Promise<VehicleLookup> {
	return bySlug.get(slug, () => lookUpSlug(slug));
}

async function lookUpSlug(slug: string): Promise<VehicleLookup> {
	const v = await Vehicle.findOne({ where: { slug }, include: INCLUDE_NAMES });
	if (v) return { vehicle: summary(v) };
	const old = await VehicleSlug.findByPk(slug);
	if (!old) return null;
	const current = await Vehicle.findByPk(old.vehicleId, { attributes: ['slug'] });
	return current ? { redirectTo: current.slug } : null;
}

export async function vehicleById(id: number): Promise<VehicleSummary | null> {
	const v = await Vehicle.findByPk(id, { include: INCLUDE_NAMES });
	return v ? summary(v) : null;
}

/** The SQL condition that the page `alias` names is open to the reader under the shop's reading rules. */
async function openPageSql(alias: string, reader: Reader): Promise<string> {
	return pageOpenSql(alias, reader, await readingRules());
}

/** Pages in title order: only those with a revision the reader may read. */
export async function listVehicles(reader: Reader, filter: { make?: string; model?: string; year?: number; body?: string; page?: number; pageSize?: number }) {
	const pageSize = Math.min(Math.max(filter.pageSize ?? 50, 1), 200);
	const page = Math.max(filter.page ?? 1, 1);
	const where: Record<string | symbol, unknown> = { [Op.and]: [literal(await openPageSql('`Vehicle`', reader))] };
	if (filter.year) Object.assign(where, { yearFrom: { [Op.lte]: filter.year }, yearTo: { [Op.gte]: filter.year } });
	if (filter.body) where.body = filter.body;
	const include = [
		{ model: Make, as: 'make', attributes: ['name', 'slug'], where: filter.make ? { slug: filter.make } : undefined },
		{ model: VehicleModel, as: 'model', attributes: ['name', 'slug'], where: filter.model ? { slug: filter.model } : undefined }
	];
	const { rows, count } = await Vehicle.findAndCountAll({
		where,
		include,
		order: [
			[{ model: Make, as: 'make' }, 'name', 'ASC'],
			[{ model: VehicleModel, as: 'model' }, 'name', 'ASC'],
			['yearFrom', 'ASC']
		],
		limit: pageSize,
		offset: (page - 1) * pageSize
	});
	return { items: rows.map(summary), total: count, page, pageSize };
}

/** Makes with their models and how many pages each has, for browsing. */
export async function catalogue(reader: Reader) {
	// One query, read as plain rows: a shop with thousands of models should not have each built as a model instance.
	const rows = await db().query<{ make: string; makeSlug: string; model: string | null; modelSlug: string | null; pages: number | string | null }>(
		`SELECT mk.name AS make, mk.slug AS makeSlug, mo.name AS model, mo.slug AS modelSlug, counts.n AS pages
		FROM makes mk
		LEFT JOIN models mo ON mo.make_id = mk.id
		LEFT JOIN (SELECT v.model_id, COUNT(*) AS n FROM vehicles v WHERE ${await openPageSql('v', reader)} GROUP BY v.model_id) counts ON counts.model_id = mo.id
		ORDER BY mk.name, mk.id`,
		{ type: QueryTypes.SELECT }
	);
	const makes = new Map<string, { name: string; slug: string; models: { name: string; slug: string; pages: number }[] }>();
	for (const r of rows) {
		let make = makes.get(r.makeSlug);
		if (!make) makes.set(r.makeSlug, (make = { name: r.make, slug: r.makeSlug, models: [] }));
		const pages = Number(r.pages ?? 0);
		if (r.model !== null && r.modelSlug !== null && pages > 0) make.models.push({ name: r.model, slug: r.modelSlug, pages });
	}
	for (const make of makes.values()) make.models.sort((a, b) => a.name.localeCompare(b.name));
	return [...makes.values()];
}

/** How many pages the reader may open: a count, without reading or building the pages themselves. */
export async function countOpenVehicles(reader: Reader): Promise<number> {
	const [row] = await db().query<{ n: number | string }>(`SELECT COUNT(*) AS n FROM vehicles v WHERE ${await openPageSql('v', reader)}`, { type: QueryTypes.SELECT });
	return Number(row.n);
}

/** The makes with at least one page the reader may open, by name: a make picker's list, without the catalogue's models and counts. */
export async function makesWithPages(reader: Reader): Promise<{ name: string; slug: string }[]> {
	return db().query<{ name: string; slug: string }>(
		`SELECT mk.name, mk.slug FROM makes mk WHERE EXISTS (SELECT 1 FROM vehicles v WHERE v.make_id = mk.id AND ${await openPageSql('v', reader)}) ORDER BY mk.name`,
		{ type: QueryTypes.SELECT }
	);
}

/** The page behind a slug (following a renamed slug), or a 404 a person understands. */
export async function requireVehicle(slug: string): Promise<VehicleSummary> {
	const found = await vehicleBySlug(slug);
	if (found && 'redirectTo' in found) {
		const moved = await vehicleBySlug(found.redirectTo);
		if (moved && 'vehicle' in moved) return moved.vehicle;
	}
	if (!found || !('vehicle' in found)) throw new ServiceError('No vehicle page at this address.', 404);
	return found.vehicle;
}
