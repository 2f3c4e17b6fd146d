// The moderator's revision actions that change what everyone reads, and the question each asks first,
// in the dialog (with scripts) and on the confirmation page (without).

export type RevisionAction = 'restore' | 'hide' | 'show';

export function revisionQuestion(act: RevisionAction, revisionId: number): { title: string; explain: string; confirm: string } {
	if (act === 'restore') {
		return {
			title: `Restore revision #${revisionId}?`,
			explain: `The page goes back to what revision #${revisionId} said, saved as a new revision. Nothing in the history is removed: a later revision can be restored the same way.`,
			confirm: `Yes, restore #${revisionId}`
		};
	}
	if (act === 'hide') {
		return {
			title: `Hide revision #${revisionId}?`,
			explain: `Its content and change note are hidden from everyone but moderators and admins (for customer details or abuse). The row stays in the history; you can show it again.`,
			confirm: `Yes, hide #${revisionId}`
		};
	}
	return {
		title: `Show revision #${revisionId} again?`,
		explain: `Everyone who may read this page sees its content and change note again.`,
		confirm: `Yes, show #${revisionId}`
	};
}

/** Where the action posts: restore and hide are actions of the history page. */
export const revisionActionPath = (slug: string, act: RevisionAction) => `/vehicles/${slug}/history?/${act === 'restore' ? 'restore' : 'hide'}`;

/** The confirmation page, for a browser without scripts. */
export const confirmPath = (slug: string, act: RevisionAction, revisionId: number) => `/vehicles/${slug}/history/confirm?do=${act}&revision=${revisionId}`;
