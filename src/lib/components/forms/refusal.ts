/** A refused form action's answer, as `formAction` on the server shapes it. */
export type Refusal<V> = {
	values: Partial<V>;
	errors: Record<string, string>;
	/** The form-wide message, when no field error already says what is wrong. */
	message: string | null;
};

type Answer = { action?: string | null; values?: unknown; errors?: Record<string, string>; message?: string };

/** What the form named `action` (null: the page's only form) should show again after a refusal. */
export function refusalFor<V = Record<string, string>>(answer: unknown, action: string | null = null): Refusal<V> {
	const a = (answer ?? {}) as Answer;
	const refused = !!a.errors && typeof a.message === 'string' && (a.action ?? null) === action;
	if (!refused) return { values: {}, errors: {}, message: null };
	const errors = a.errors ?? {};
	return { values: (a.values ?? {}) as Partial<V>, errors, message: Object.keys(errors).length ? null : (a.message ?? null) };
}
