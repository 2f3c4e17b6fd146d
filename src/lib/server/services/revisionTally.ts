import { Op } from 'sequelize';
import { Revision } from '../db/models';
import { parseContent, type VehicleContent } from '../../domain/content/schema';
import { tallyChanges, type ChangeTally } from '../../domain/content/changeTally';

// A revision and its parent never change, so each count is worked out once and kept.
const tallies = new Map<number, ChangeTally>();
const TALLY_LIMIT = 20_000;

function readContent(json: string): VehicleContent {
	const parsed = parseContent(json);
	return parsed.success ? parsed.data : (JSON.parse(json) as VehicleContent);
}

type Listed = { id: number; parentId: number | null; hidden: boolean };

/**
 * Each listed revision with what it changed against its parent: fields, notes and measured figures.
 * A first revision (a new page) and a hidden one get null: there is nothing to count, or nothing to show.
 */
export async function withTallies<T extends Listed>(items: readonly T[]): Promise<(T & { tally: ChangeTally | null })[]> {
	const wanted = items.filter((r) => r.parentId !== null && !r.hidden && !tallies.has(r.id));
	if (wanted.length) {
		const ids = [...new Set(wanted.flatMap((r) => [r.id, r.parentId as number]))];
		const rows = await Revision.findAll({ where: { id: { [Op.in]: ids } }, attributes: ['id', 'content'] });
		const content = new Map(rows.map((row) => [Number(row.id), row.content]));
		for (const r of wanted) {
			const after = content.get(r.id);
			const before = content.get(r.parentId as number);
			if (after === undefined || before === undefined) continue;
			if (tallies.size >= TALLY_LIMIT) tallies.delete(tallies.keys().next().value!);
			tallies.set(r.id, tallyChanges(readContent(before), readContent(after)));
		}
	}
	return items.map((r) => ({ ...r, tally: r.parentId === null || r.hidden ? null : (tallies.get(r.id) ?? null) }));
}
