import { diffArrays } from 'diff';
import { describePath, formatPath, parsePath, type PathSegment } from './fieldDiff';
import { canonicalJson } from './canonicalJson';
import type { VehicleContent } from './schema';
import { FIELD_INFO } from './vehicleFields';

// Two writers opened the same revision (base); "theirs" was saved first, "yours" is
// being saved now. Whatever only one side touched is taken from that side.

export interface MergeConflict {
	path: string;
	label: string;
	base: unknown;
	theirs: unknown;
	/** The saving writer's value; `merged` holds it too, so nothing typed is lost. */
	yours: unknown;
}

export interface MergeResult {
	merged: VehicleContent;
	conflicts: MergeConflict[];
}

type Entry = { id: string } & Record<string, unknown>;

const same = (a: unknown, b: unknown) => canonicalJson(a) === canonicalJson(b);

const isRecord = (v: unknown): v is Record<string, unknown> =>
	v !== null && typeof v === 'object' && !Array.isArray(v);

const isEntryList = (v: unknown): v is Entry[] =>
	Array.isArray(v) && v.every((e) => isRecord(e) && typeof e.id === 'string');

interface Context {
	base: unknown;
	theirs: unknown;
	yours: unknown;
	conflicts: MergeConflict[];
}

function conflict(ctx: Context, path: PathSegment[], base: unknown, theirs: unknown, yours: unknown): void {
	const p = formatPath(path);
	ctx.conflicts.push({ path: p, label: describePath(p, ctx.yours, ctx.theirs, ctx.base), base, theirs, yours });
}

function mergeValue(base: unknown, theirs: unknown, yours: unknown, path: PathSegment[], pattern: string, ctx: Context): unknown {
	if (same(theirs, yours)) return theirs;
	if (same(base, theirs)) return yours;
	if (same(base, yours)) return theirs;
	const info = FIELD_INFO[pattern];
	if (info) {
		if (info.kind === 'markdown' && typeof theirs === 'string' && typeof yours === 'string') {
			const text = mergeText(typeof base === 'string' ? base : '', theirs, yours);
			if (text.clean) return text.text;
		}
		conflict(ctx, path, base, theirs, yours);
		return yours;
	}
	if (isEntryList(theirs) && isEntryList(yours)) {
		return mergeEntries(isEntryList(base) ? base : [], theirs, yours, path, pattern, ctx);
	}
	if (isRecord(theirs) && isRecord(yours)) {
		const b = isRecord(base) ? base : {};
		const out: Record<string, unknown> = {};
		const keys = Object.keys(yours);
		for (const k of Object.keys(theirs)) if (!keys.includes(k)) keys.push(k);
		for (const key of keys) {
			const v = mergeValue(b[key], theirs[key], yours[key], [...path, key], pattern ? `${pattern}.${key}` : key, ctx);
			if (v !== undefined) out[key] = v;
		}
		return out;
	}
	conflict(ctx, path, base, theirs, yours);
	return yours;
}

function mergeEntries(base: Entry[], theirs: Entry[], yours: Entry[], path: PathSegment[], pattern: string, ctx: Context): Entry[] {
	const b = new Map(base.map((e) => [e.id, e]));
	const t = new Map(theirs.map((e) => [e.id, e]));
	const y = new Map(yours.map((e) => [e.id, e]));
	const kept = new Map<string, Entry>();
	const ids = [...new Set([...yours, ...theirs, ...base].map((e) => e.id))];
	for (const id of ids) {
		const [be, te, ye] = [b.get(id), t.get(id), y.get(id)];
		const entryPath = [...path, { id }];
		if (te && ye) {
			kept.set(id, mergeValue(be, te, ye, entryPath, `${pattern}[]`, ctx) as Entry);
		} else if (be && te && !ye) {
			// You removed it; if they changed it meanwhile, ask.
			if (!same(be, te)) conflict(ctx, entryPath, be, te, null);
		} else if (be && ye && !te) {
			if (!same(be, ye)) {
				conflict(ctx, entryPath, be, null, ye);
				kept.set(id, ye);
			}
		} else if (!be && te) {
			kept.set(id, te);
		} else if (!be && ye) {
			kept.set(id, ye);
		}
	}
	return orderEntries(base, theirs, yours, kept);
}

/**
 * Entry order: the side that reordered wins (yours if both did); entries only the
 * other side has go in after the entry they followed there.
 */
function orderEntries(base: Entry[], theirs: Entry[], yours: Entry[], kept: Map<string, Entry>): Entry[] {
	const baseIds = new Set(base.map((e) => e.id));
	const yourIds = new Set(yours.map((e) => e.id));
	const yoursReordered = !same(
		yours.filter((e) => baseIds.has(e.id)).map((e) => e.id),
		base.filter((e) => yourIds.has(e.id)).map((e) => e.id)
	);
	const [lead, other] = yoursReordered ? [yours, theirs] : [theirs, yours];
	const order = lead.map((e) => e.id).filter((id) => kept.has(id));
	other.forEach((e, i) => {
		if (!kept.has(e.id) || order.includes(e.id)) return;
		let at = 0;
		for (let j = i - 1; j >= 0; j--) {
			const k = order.indexOf(other[j].id);
			if (k >= 0) {
				at = k + 1;
				break;
			}
		}
		// Past the lead side's own additions at that spot, so each side's new entries stay together.
		while (at < order.length && !baseIds.has(order[at])) at++;
		order.splice(at, 0, e.id);
	});
	return order.map((id) => kept.get(id) as Entry);
}

/** Replace base lines [start, end) with `lines`. */
interface Hunk {
	start: number;
	end: number;
	lines: string[];
	side: 'theirs' | 'yours';
}

function hunks(base: string[], side: string[], name: Hunk['side']): Hunk[] {
	const out: Hunk[] = [];
	let at = 0;
	let open: Hunk | null = null;
	for (const change of diffArrays(base, side)) {
		if (change.added) {
			open ??= { start: at, end: at, lines: [], side: name };
			open.lines.push(...change.value);
		} else if (change.removed) {
			open ??= { start: at, end: at, lines: [], side: name };
			at += change.value.length;
			open.end = at;
		} else {
			if (open) out.push(open);
			open = null;
			at += change.value.length;
		}
	}
	if (open) out.push(open);
	return out;
}

// Changes collide when they touch a common base line, or one inserts strictly inside
// the other's range, or both insert at the same spot (diff3's notion of overlap).
function collides(start: number, end: number, h: Hunk): boolean {
	if (h.start === h.end) return (start < h.start && h.start < end) || (start === end && start === h.start);
	if (start === end) return h.start < start && start < h.end;
	return h.start < end && start < h.end;
}

function applyHunks(base: string[], start: number, end: number, list: Hunk[]): string[] {
	const out: string[] = [];
	let at = start;
	for (const h of list) {
		out.push(...base.slice(at, h.start), ...h.lines);
		at = h.end;
	}
	out.push(...base.slice(at, end));
	return out;
}

/**
 * Three-way merge of Markdown by lines: changes to different lines both apply; the
 * same lines changed differently on both sides is not clean and gives back yours.
 */
export function mergeText(base: string, theirs: string, yours: string): { text: string; clean: boolean } {
	if (theirs === yours || base === theirs) return { text: yours, clean: true };
	if (base === yours) return { text: theirs, clean: true };
	const lines = base.split('\n');
	const all = [...hunks(lines, theirs.split('\n'), 'theirs'), ...hunks(lines, yours.split('\n'), 'yours')].sort(
		(a, b) => a.start - b.start || a.end - b.end || (a.side === 'theirs' ? -1 : 1)
	);
	const out: string[] = [];
	let at = 0;
	let i = 0;
	while (i < all.length) {
		let { start, end } = all[i];
		const group = [all[i++]];
		while (i < all.length && collides(start, end, all[i])) {
			start = Math.min(start, all[i].start);
			end = Math.max(end, all[i].end);
			group.push(all[i++]);
		}
		const mine = group.filter((h) => h.side === 'yours');
		const other = group.filter((h) => h.side === 'theirs');
		const mineText = applyHunks(lines, start, end, mine);
		if (other.length && mine.length && !same(mineText, applyHunks(lines, start, end, other))) {
			return { text: yours, clean: false };
		}
		out.push(...lines.slice(at, start), ...(mine.length ? mineText : applyHunks(lines, start, end, other)));
		at = end;
	}
	out.push(...lines.slice(at));
	return { text: out.join('\n'), clean: true };
}

/** Field-level three-way merge of two edits of one revision. */
export function mergeContent(base: VehicleContent, theirs: VehicleContent, yours: VehicleContent): MergeResult {
	const ctx: Context = { base, theirs, yours, conflicts: [] };
	// A copy, so later edits to the merged page never reach the inputs.
	const merged = structuredClone(mergeValue(base, theirs, yours, [], '', ctx)) as VehicleContent;
	keepYearRangeWhole(merged, ctx);
	return { merged, conflicts: ctx.conflicts };
}

// One side moved the first year, the other the last, and together they cross: keep
// your range and ask about both ends.
function keepYearRangeWhole(merged: VehicleContent, ctx: Context): void {
	const [b, t, y] = [ctx.base, ctx.theirs, ctx.yours] as VehicleContent[];
	if (merged.identity.yearTo >= merged.identity.yearFrom || y.identity.yearTo < y.identity.yearFrom) return;
	merged.identity = { ...merged.identity, yearFrom: y.identity.yearFrom, yearTo: y.identity.yearTo };
	for (const key of ['yearFrom', 'yearTo'] as const) {
		if (t.identity[key] === y.identity[key] || ctx.conflicts.some((c) => c.path === `identity.${key}`)) continue;
		conflict(ctx, ['identity', key], b.identity[key], t.identity[key], y.identity[key]);
	}
}

export type ConflictChoice = 'base' | 'theirs' | 'yours';

/** The merged page with each conflict settled as chosen; unlisted conflicts keep yours. */
export function applyResolution(
	merged: VehicleContent,
	conflicts: readonly MergeConflict[],
	choices: Readonly<Record<string, ConflictChoice>>
): VehicleContent {
	const out = structuredClone(merged);
	for (const c of conflicts) {
		const choice = choices[c.path] ?? 'yours';
		setAtPath(out, parsePath(c.path), structuredClone(c[choice]));
	}
	return out;
}

function setAtPath(root: unknown, segs: PathSegment[], value: unknown): void {
	let node: unknown = root;
	for (let i = 0; i < segs.length - 1; i++) {
		const seg = segs[i];
		node =
			typeof seg === 'string'
				? isRecord(node)
					? node[seg]
					: undefined
				: Array.isArray(node)
					? node.find((e) => isRecord(e) && e.id === seg.id)
					: undefined;
		if (node === undefined) return;
	}
	const last = segs[segs.length - 1];
	if (typeof last === 'string') {
		if (isRecord(node)) node[last] = value;
		return;
	}
	if (!Array.isArray(node)) return;
	const at = node.findIndex((e) => isRecord(e) && e.id === last.id);
	if (value == null) {
		if (at >= 0) node.splice(at, 1);
	} else if (at >= 0) {
		node[at] = value;
	} else {
		node.push(value);
	}
}
