// What installers said about a page: confirmations and open flags, as the reading view shows them.

export type TrustFlag = {
	id: number;
	fieldPath: string | null;
	label: string;
	note: string;
	by: string;
	at: string;
	revisionId: number;
	/** The flagged value as it reads today, in the reader's units. */
	value: string | null;
};

export type TrustSummary = {
	vehicleId: number;
	revisionId: number | null;
	confirmations: {
		/** Different installers who marked any revision as fitted as described. */
		installers: number;
		/** Of those, how many marked the current revision. */
		onCurrentRevision: number;
		latest: { by: string; at: string; revisionId: number; note: string } | null;
	};
	openFlags: TrustFlag[];
	/** Open flags keyed by field path ("" for the page as a whole). */
	flagsByField: Record<string, TrustFlag[]>;
	closedFlags: number;
};
