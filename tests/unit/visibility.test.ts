import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { ROLES, type Role } from '../../src/lib/domain/roles';
import { OPEN_RULES, mayReadRevision, readsHidden, readsUnsignedOff, signedOff, type ReadingRules, type RevisionFlags } from '../../src/lib/domain/visibility';

// Expected values are the product's reading rule as written in DEVELOPERS.md ("Who reads what"), worked by hand.

const since = new Date('2026-06-01T12:00:00.000Z');
const SIGN_OFF: ReadingRules = { signOffRequired: true, signOffSince: since };
const rev = (over: Partial<RevisionFlags> = {}): RevisionFlags => ({ hidden: false, reviewedAt: null, createdAt: new Date('2026-07-01T00:00:00Z'), ...over });
const as = (role: Role) => ({ role });

describe('who reads a revision', () => {
	it('keeps a hidden revision from everyone below moderator, whatever the sign-off setting', () => {
		for (const rules of [OPEN_RULES, SIGN_OFF]) {
			const hidden = rev({ hidden: true, reviewedAt: since });
			expect(ROLES.filter((r) => mayReadRevision(hidden, as(r), rules))).toEqual(['moderator', 'admin']);
			expect(mayReadRevision(hidden, null, rules)).toBe(false);
		}
	});

	it('lets everyone signed in read an unhidden revision while sign-off is not required', () => {
		for (const role of ROLES) expect(mayReadRevision(rev(), as(role), OPEN_RULES)).toBe(true);
	});

	it('keeps an unsigned change from viewers while sign-off is required; editors and up still read it', () => {
		expect(ROLES.filter((r) => mayReadRevision(rev(), as(r), SIGN_OFF))).toEqual(['editor', 'moderator', 'admin']);
		expect(mayReadRevision(rev(), null, SIGN_OFF)).toBe(false);
	});

	it('counts a revision signed off, or saved before sign-off was required, as open to viewers', () => {
		expect(mayReadRevision(rev({ reviewedAt: new Date('2026-07-02T00:00:00Z') }), as('viewer'), SIGN_OFF)).toBe(true);
		expect(mayReadRevision(rev({ createdAt: new Date('2026-06-01T11:59:59.999Z') }), as('viewer'), SIGN_OFF)).toBe(true);
		// Saved at the very moment it was switched on: after, so it waits.
		expect(mayReadRevision(rev({ createdAt: since }), as('viewer'), SIGN_OFF)).toBe(false);
		// Required with no recorded moment: only a sign-off opens a revision.
		expect(signedOff(rev({ createdAt: new Date('2000-01-01T00:00:00Z') }), { signOffRequired: true, signOffSince: null })).toBe(false);
	});

	it('orders readers: whatever a role may read, every higher role may read too', () => {
		const flags = fc.record({
			hidden: fc.boolean(),
			reviewedAt: fc.option(fc.date({ noInvalidDate: true }), { nil: null }),
			createdAt: fc.date({ noInvalidDate: true })
		});
		const rules = fc.record({ signOffRequired: fc.boolean(), signOffSince: fc.option(fc.date({ noInvalidDate: true }), { nil: null }) });
		fc.assert(
			fc.property(flags, rules, (f, r) => {
				const reads = ROLES.map((role) => mayReadRevision(f, as(role), r));
				for (let i = 1; i < reads.length; i++) if (reads[i - 1]) expect(reads[i]).toBe(true);
				// Nobody below moderator reads a hidden revision.
				if (f.hidden) expect(reads.slice(0, 2)).toEqual([false, false]);
				// Without sign-off, viewers and editors read the same.
				if (!r.signOffRequired) expect(reads[0]).toBe(reads[1]);
			})
		);
	});

	it('names the reader classes', () => {
		expect(ROLES.filter((r) => readsHidden(as(r)))).toEqual(['moderator', 'admin']);
		expect(ROLES.filter((r) => readsUnsignedOff(as(r), SIGN_OFF))).toEqual(['editor', 'moderator', 'admin']);
		expect(readsUnsignedOff(null, OPEN_RULES)).toBe(true);
	});
});
