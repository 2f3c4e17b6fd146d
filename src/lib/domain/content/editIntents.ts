import { lengthText, readLength, type LengthUnit } from '../units';
import type { FieldNode, FieldTree, GroupNode, ListNode, LeafNode } from './fieldTree';
import type { ContentDraft } from './formCodec';
import { formRoot, INDEX, isRecord, type Raw } from './formShape';
import { newItemId } from './itemId';
import { VEHICLE_FIELDS } from './vehicleFields';
import { SEATS } from './vocabulary';

// What the editor's buttons do to the form before anything is saved: add, remove and move
// list entries, and retype lengths in the other unit. The same code runs in the browser and,
// without scripts, on the server.

export type EditIntent =
	| { kind: 'save' }
	| { kind: 'stay' }
	| { kind: 'add'; list: string }
	| { kind: 'remove'; list: string; index: number }
	| { kind: 'move'; list: string; index: number; direction: 'up' | 'down' }
	| { kind: 'unit'; unit: LengthUnit };

/** The value of the submit button pressed: "save", "add:seats.spaces", "remove:seats.spaces:1", "move:removal.steps:2:up", "unit:in". */
export function readIntent(value: unknown): EditIntent {
	const text = typeof value === 'string' ? value : 'save';
	const [kind, list, index, direction] = text.split(':');
	if (kind === 'add' && list) return { kind, list };
	if (kind === 'remove' && list && INDEX.test(index ?? '')) return { kind, list, index: Number(index) };
	if (kind === 'move' && list && INDEX.test(index ?? '') && (direction === 'up' || direction === 'down')) return { kind, list, index: Number(index), direction };
	if (kind === 'unit' && (list === 'mm' || list === 'in')) return { kind, unit: list };
	if (kind === 'stay') return { kind };
	return { kind: 'save' };
}

interface ListAt {
	node: ListNode | LeafNode;
	list: unknown[];
}

const childOf = (group: GroupNode, key: string) => group.children.find((c) => c.key === key);

/** The list a dotted form path points at, e.g. "harness.ladder.lines.2.buttons". */
function listAt(draft: ContentDraft, path: string, fields: FieldTree): ListAt | null {
	let group: GroupNode = formRoot(fields);
	let value: unknown = draft;
	const segs = path.split('.');
	for (let i = 0; i < segs.length; i++) {
		const node = childOf(group, segs[i]);
		if (!node || !isRecord(value)) return null;
		value = value[segs[i]];
		const last = i === segs.length - 1;
		if (node.type === 'field') return last && node.info.kind === 'textList' && Array.isArray(value) ? { node, list: value } : null;
		if (node.type === 'group') {
			group = node;
			continue;
		}
		if (!Array.isArray(value)) return null;
		if (last) return { node, list: value };
		const at = segs[++i];
		if (!INDEX.test(at ?? '')) return null;
		value = value[Number(at)];
		group = node.entry;
	}
	return null;
}

function blankEntry(group: GroupNode): Raw {
	const out: Raw = {};
	for (const node of group.children) {
		if (node.type === 'group') out[node.key] = blankEntry(node);
		else if (node.type === 'list') out[node.key] = [];
		else if (node.info.kind === 'textList') out[node.key] = [];
		else if (node.info.kind === 'choice' && !node.nullable) out[node.key] = Object.keys(node.info.choices ?? {})[0] ?? '';
		else out[node.key] = '';
	}
	return out;
}

const MAX_ENTRIES = 200;

/** Applies an add/remove/move/unit intent to the draft in place; returns the unit now in use. */
export function applyIntent(draft: ContentDraft, intent: EditIntent, unit: LengthUnit, fields: FieldTree = VEHICLE_FIELDS): LengthUnit {
	if (intent.kind === 'unit') {
		convertDraftUnits(draft, unit, intent.unit, fields);
		return intent.unit;
	}
	if (intent.kind !== 'add' && intent.kind !== 'remove' && intent.kind !== 'move') return unit;
	const at = listAt(draft, intent.list, fields);
	if (!at) return unit;
	if (intent.kind === 'remove') {
		if (intent.index < at.list.length) at.list.splice(intent.index, 1);
		return unit;
	}
	if (intent.kind === 'move') {
		// Swaps the entry with its neighbour; at either end of the list nothing moves.
		const to = intent.index + (intent.direction === 'up' ? -1 : 1);
		if (intent.index < at.list.length && to >= 0 && to < at.list.length) {
			[at.list[intent.index], at.list[to]] = [at.list[to], at.list[intent.index]];
		}
		return unit;
	}
	if (at.list.length >= MAX_ENTRIES) return unit;
	if (at.node.type === 'field') {
		at.list.push('');
		return unit;
	}
	const entry: Raw = { id: newItemId(), ...blankEntry(at.node.entry) };
	// A new seat space starts on a seat not yet recorded.
	if (at.node.pattern === 'seats.spaces') {
		const used = new Set(at.list.map((e) => (isRecord(e) ? e.seat : null)));
		entry.seat = SEATS.find((s) => !used.has(s)) ?? SEATS[0];
	}
	at.list.push(entry);
	return unit;
}

function convertNode(node: FieldNode, value: unknown, from: LengthUnit, to: LengthUnit, set: (v: string) => void): void {
	if (node.type === 'field') {
		const kind = node.info.kind;
		if ((kind !== 'mm' && kind !== 'm') || typeof value !== 'string' || !value.trim()) return;
		try {
			set(lengthText(kind, readLength(kind, value, from), to));
		} catch {
			// Left as typed; saving will point at it.
		}
		return;
	}
	if (node.type === 'list') {
		if (Array.isArray(value)) for (const item of value) convertNode(node.entry, item, from, to, () => {});
		return;
	}
	if (!isRecord(value)) return;
	for (const child of node.children) convertNode(child, value[child.key], from, to, (v) => (value[child.key] = v));
}

/** Retypes every readable length in the other unit; unreadable text stays as typed. */
export function convertDraftUnits(draft: ContentDraft, from: LengthUnit, to: LengthUnit, fields: FieldTree = VEHICLE_FIELDS): void {
	if (from === to) return;
	convertNode(formRoot(fields), draft, from, to, () => {});
}
