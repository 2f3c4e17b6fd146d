import { describe, expect, it } from 'vitest';
import { draftKey, draftToOffer, forgetDrafts, keepDraft, sameWork, type DraftShelf, type KeptDraft } from '../../src/lib/components/editor/draftStore';
import type { ContentDraft } from '../../src/lib/domain/content/formCodec';

/** Web Storage's behaviour over a Map, with an optional quota to fill. */
function shelf(quota = Infinity): DraftShelf & { map: Map<string, string> } {
	const map = new Map<string, string>();
	return {
		map,
		get length() {
			return map.size;
		},
		key: (i) => [...map.keys()][i] ?? null,
		getItem: (k) => map.get(k) ?? null,
		setItem: (k, v) => {
			if (v.length > quota) throw new DOMException('full', 'QuotaExceededError');
			map.set(k, v);
		},
		removeItem: (k) => void map.delete(k)
	};
}

const draft = (height: string) => ({ seats: { spaces: [{ heightMm: height }] } }) as unknown as ContentDraft;
const kept = (vehicleId: number, baseRevisionId: number, height: string, keptAt: string): KeptDraft => ({
	vehicleId,
	baseRevisionId,
	draft: draft(height),
	unit: 'mm',
	summary: '',
	keptAt
});

describe('drafts kept on the device', () => {
	it('offers the draft started from the same revision first', () => {
		const s = shelf();
		keepDraft(s, kept(3, 10, '80', '2026-01-02T10:00:00Z'));
		keepDraft(s, kept(3, 12, '81', '2026-01-01T10:00:00Z'));
		expect(draftToOffer(s, 3, 12)?.draft).toEqual(draft('81'));
	});

	it('offers the newest older draft when the page moved on, never a newer base or another page', () => {
		const s = shelf();
		keepDraft(s, kept(3, 8, '78', '2026-01-01T10:00:00Z'));
		keepDraft(s, kept(3, 9, '79', '2026-01-03T10:00:00Z'));
		keepDraft(s, kept(3, 20, '90', '2026-01-04T10:00:00Z'));
		keepDraft(s, kept(30, 11, '99', '2026-01-05T10:00:00Z'));
		expect(draftToOffer(s, 3, 11)).toMatchObject({ baseRevisionId: 9, draft: draft('79') });
		expect(draftToOffer(s, 4, 11)).toBeNull();
	});

	it('forgets every draft of the page and only that page', () => {
		const s = shelf();
		keepDraft(s, kept(3, 8, '78', '2026-01-01T10:00:00Z'));
		keepDraft(s, kept(3, 9, '79', '2026-01-01T10:00:00Z'));
		keepDraft(s, kept(33, 9, '79', '2026-01-01T10:00:00Z'));
		forgetDrafts(s, 3);
		expect([...s.map.keys()]).toEqual([draftKey(33, 9)]);
	});

	it('treats a full or spoilt storage as holding nothing', () => {
		const full = shelf(10);
		expect(keepDraft(full, kept(3, 8, '78', '2026-01-01T10:00:00Z'))).toBe(false);
		const spoilt = shelf();
		spoilt.setItem(draftKey(3, 8), '{not json');
		expect(draftToOffer(spoilt, 3, 8)).toBeNull();
	});

	it('counts typed work by content and summary, not by spacing round the summary', () => {
		expect(sameWork({ draft: draft('80'), summary: ' x ' }, { draft: draft('80'), summary: 'x' })).toBe(true);
		expect(sameWork({ draft: draft('80'), summary: '' }, { draft: draft('81'), summary: '' })).toBe(false);
	});
});
