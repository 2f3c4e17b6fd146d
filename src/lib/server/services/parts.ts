import { Op, UniqueConstraintError, type WhereOptions } from 'sequelize';
import { z } from 'zod';
import { db } from '../db';
import { Part as PartRow } from '../db/models';
import {
	emptyPartForm,
	PART_KINDS,
	partFieldsFromForm,
	type Part,
	type PartData,
	type PartFormValues,
	type PartKind
} from '../../domain/part';
import { readPartForm } from '../../domain/partForm';
import { partInputSchema } from '../../domain/partSchema';
import type { SessionUser } from '../../domain/sessionUser';
import { roleAtLeast } from '../../domain/roles';
import { recordAudit } from './audit';
import { ServiceError, fieldMessages } from '../errors';

// The kind's own figures; the box columns and names live in their own columns.
const COLUMNS = ['kind', 'sku', 'name', 'lengthMm', 'widthMm', 'heightMm', 'notes'] as const;

function toPart(row: PartRow): Part {
	const specs = JSON.parse(row.specs) as Record<string, unknown>;
	const data = {
		...specs,
		kind: row.kind,
		sku: row.sku,
		name: row.name,
		notes: row.notes,
		lengthMm: row.lengthMm,
		widthMm: row.widthMm,
		heightMm: row.heightMm
	};
	// Stored rows were validated on the way in; parsing again fills defaults added since.
	const parsed = partInputSchema.safeParse(data);
	if (!parsed.success) throw new Error(`Part ${row.id} (${row.sku}) does not read as a ${row.kind}: ${parsed.error.issues[0]?.message}`);
	return { id: row.id, ...parsed.data };
}

/** The catalogue form as posted, read in the unit it was typed in; a refusal names each field at fault. */
export function partFromForm(posted: FormData): PartData {
	const read = readPartForm(partFieldsFromForm(posted.entries()), posted.get('unit') === 'in' ? 'in' : 'mm');
	if (!read.ok) throw new ServiceError('Some fields need attention; nothing was saved.', 400, read.errors);
	return read.part;
}

/** The catalogue form as posted, to show again after a refusal. */
export function postedPartForm(posted: FormData): PartFormValues {
	return { ...emptyPartForm(), ...partFieldsFromForm(posted.entries()) };
}

function toColumns(part: PartData) {
	const specs: Record<string, unknown> = {};
	for (const [key, value] of Object.entries(part)) {
		if (!(COLUMNS as readonly string[]).includes(key)) specs[key] = value;
	}
	const box = part as Partial<Record<'lengthMm' | 'widthMm' | 'heightMm', number | null>>;
	return {
		kind: part.kind,
		sku: part.sku,
		name: part.name,
		notes: part.notes,
		lengthMm: box.lengthMm ?? null,
		widthMm: box.widthMm ?? null,
		heightMm: box.heightMm ?? null,
		specs: JSON.stringify(specs)
	};
}

export function validatePart(input: unknown): PartData {
	const parsed = partInputSchema.safeParse(input);
	if (!parsed.success) {
		const fields = fieldMessages(parsed.error);
		const first = Object.values(fields)[0] ?? 'The part is not valid.';
		throw new ServiceError(`Some fields need attention: ${first}`, 400, fields);
	}
	return parsed.data;
}

function requireCatalogueRole(user: SessionUser): void {
	if (!roleAtLeast(user.role, 'moderator')) {
		throw new ServiceError(`Managing the parts catalogue needs the moderator role or higher; you are signed in as ${user.role}.`, 403);
	}
}

const duplicateSku = (sku: string) =>
	new ServiceError(`Another part already has the SKU "${sku}".`, 409, { sku: `Another part already has the SKU "${sku}".` });

export const partFilterSchema = z.object({
	kind: z.enum(PART_KINDS, { error: `Kind must be one of: ${PART_KINDS.join(', ')}.` }).optional(),
	q: z.string().trim().max(100, 'Keep the search under 100 characters.').optional()
});
export type PartFilter = z.input<typeof partFilterSchema>;

/** The catalogue, by kind then name; `q` matches SKU or name. */
export async function listParts(filter: PartFilter = {}): Promise<Part[]> {
	const { kind, q } = partFilterSchema.parse(filter);
	const where: WhereOptions = {};
	if (kind) Object.assign(where, { kind });
	if (q) {
		const like = `%${q.replace(/[\\%_]/g, (c) => `\\${c}`)}%`;
		Object.assign(where, { [Op.or]: [{ sku: { [Op.like]: like } }, { name: { [Op.like]: like } }] });
	}
	const rows = await PartRow.findAll({ where, order: [['kind', 'ASC'], ['name', 'ASC']] });
	return rows.map(toPart);
}

export async function partById(id: number): Promise<Part | null> {
	if (!Number.isInteger(id) || id <= 0) return null;
	const row = await PartRow.findByPk(id);
	return row ? toPart(row) : null;
}

export async function requirePart(id: number): Promise<Part> {
	const part = await partById(id);
	if (!part) throw new ServiceError('No part with that number in the catalogue.', 404);
	return part;
}

export async function partsByIds(ids: readonly number[]): Promise<Part[]> {
	const wanted = [...new Set(ids.filter((id) => Number.isInteger(id) && id > 0))];
	if (wanted.length === 0) return [];
	const rows = await PartRow.findAll({ where: { id: wanted } });
	const byId = new Map(rows.map((r) => [r.id, toPart(r)]));
	return wanted.flatMap((id) => byId.get(id) ?? []);
}

export async function createPart(input: unknown, actor: SessionUser): Promise<Part> {
	requireCatalogueRole(actor);
	const part = validatePart(input);
	try {
		const row = await db().transaction(async (transaction) => {
			const created = await PartRow.create({ ...toColumns(part), createdBy: actor.id, updatedBy: actor.id }, { transaction });
			await recordAudit({ actorId: actor.id, action: 'part.create', targetType: 'part', targetId: created.id, details: { sku: part.sku } }, transaction);
			return created;
		});
		return toPart(row);
	} catch (err) {
		if (err instanceof UniqueConstraintError) throw duplicateSku(part.sku);
		throw err;
	}
}

export async function updatePart(id: number, input: unknown, actor: SessionUser): Promise<Part> {
	requireCatalogueRole(actor);
	const part = validatePart(input);
	try {
		const row = await db().transaction(async (transaction) => {
			const existing = await PartRow.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
			if (!existing) throw new ServiceError('No part with that number in the catalogue.', 404);
			const before = { sku: existing.sku, name: existing.name };
			await existing.update({ ...toColumns(part), updatedBy: actor.id }, { transaction });
			await recordAudit({ actorId: actor.id, action: 'part.update', targetType: 'part', targetId: id, details: { before, sku: part.sku } }, transaction);
			return existing;
		});
		return toPart(row);
	} catch (err) {
		if (err instanceof UniqueConstraintError) throw duplicateSku(part.sku);
		throw err;
	}
}

export async function deletePart(id: number, actor: SessionUser): Promise<void> {
	requireCatalogueRole(actor);
	await db().transaction(async (transaction) => {
		const existing = await PartRow.findByPk(id, { transaction, lock: transaction.LOCK.UPDATE });
		if (!existing) throw new ServiceError('No part with that number in the catalogue.', 404);
		await existing.destroy({ transaction });
		await recordAudit(
			{ actorId: actor.id, action: 'part.delete', targetType: 'part', targetId: id, details: { sku: existing.sku, name: existing.name } },
			transaction
		);
	});
}

/** Sample catalogue rows as written in content-seed/parts.json ("class" for the amplifier class). */
export function samplePartInput(raw: Record<string, unknown>): unknown {
	const { class: ampClass, ...rest } = raw;
	return ampClass === undefined ? rest : { ...rest, ampClass };
}

export async function partCounts(): Promise<Record<PartKind, number>> {
	const rows = (await PartRow.findAll({ attributes: ['kind', [db().fn('COUNT', db().col('id')), 'n']], group: ['kind'], raw: true })) as unknown as {
		kind: PartKind;
		n: number;
	}[];
	const counts = Object.fromEntries(PART_KINDS.map((k) => [k, 0])) as Record<PartKind, number>;
	for (const r of rows) counts[r.kind] = Number(r.n);
	return counts;
}
