import type { FieldNode, GroupNode, LeafNode } from '../../domain/content/fieldTree';

// How a group of fields is laid out in the editor, worked out from the field tree: short inputs
// side by side in a grid, text lists in pairs, notes, ticks and lists of entries full width.

export type Block =
	| { type: 'row'; grid: string; fields: LeafNode[] }
	| { type: 'textLists'; fields: LeafNode[] }
	| { type: 'wide'; node: FieldNode };

const TEXT_LISTS = 'grid gap-4 lg:grid-cols-2';

const isWide = (node: FieldNode) =>
	node.type !== 'field' || node.info.kind === 'markdown' || (node.info.kind === 'flag' && !node.nullable);

/** The group's fields in rows; `grid` is the classes of a row that does not name its own. */
export function blocksOf(group: GroupNode, grid: string): Block[] {
	const blocks: Block[] = [];
	for (const node of group.children) {
		const last = blocks[blocks.length - 1];
		if (isWide(node)) blocks.push({ type: 'wide', node });
		else if (node.type !== 'field') continue;
		else if (node.info.kind === 'textList') {
			if (last?.type === 'textLists') last.fields.push(node);
			else blocks.push({ type: 'textLists', fields: [node] });
		} else if (last?.type === 'row' && !node.info.edit?.row) last.fields.push(node);
		else blocks.push({ type: 'row', grid: node.info.edit?.row ?? grid, fields: [node] });
	}
	return blocks;
}

export const textListGrid = TEXT_LISTS;

/**
 * A group of the editor's draft. Each value is text, a list of text or a nested group, as the
 * field's kind says; the inputs bind to them by key, so the type is left open here.
 */
export type DraftGroup = Record<string, any>;
