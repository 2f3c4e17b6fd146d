// Rules for the figures a calculator is handed, small enough to run on the phone. Every reason a
// figure is refused is kept, in field order, in the shop's words; `checkFigures` throws them as one
// RangeError, and the endpoints read the same rules through `schemaOf` (ruleSchema.ts).

export interface Problem {
	path: (string | number)[];
	message: string;
}

/** Reads one value: returns it (defaults filled in), or records why it cannot be read. */
export type Rule<T> = (value: unknown, path: (string | number)[], problems: Problem[]) => T;
export type RuleOutput<R> = R extends Rule<infer T> ? T : never;

/** A test on a number and the words for one that fails it; a `stop` check ends the reading when it fails. */
export type NumberCheck = readonly [ok: (n: number) => boolean, message: string, stop?: boolean];

/** A finite number that passes every check; each failed check adds its reason. */
export function number(typeMessage: string, ...checks: readonly NumberCheck[]): Rule<number> {
	return (value, path, problems) => {
		if (typeof value !== 'number' || !Number.isFinite(value)) {
			problems.push({ path, message: typeMessage });
			return NaN;
		}
		for (const [ok, message, stop] of checks) {
			if (ok(value)) continue;
			problems.push({ path, message });
			if (stop) break;
		}
		return value;
	};
}

/** A whole number: a fraction goes no further; past the range counted exactly, it reads as not whole either. */
export const whole = (message: string): NumberCheck[] => [
	[Number.isInteger, message, true],
	[Number.isSafeInteger, message]
];

export const nullable =
	<T>(rule: Rule<T>): Rule<T | null> =>
	(value, path, problems) =>
		value === null ? null : rule(value, path, problems);

export const optional =
	<T>(rule: Rule<T>): Rule<T | undefined> =>
	(value, path, problems) =>
		value === undefined ? undefined : rule(value, path, problems);

export const orDefault =
	<T>(rule: Rule<T>, fallback: T): Rule<T> =>
	(value, path, problems) =>
		value === undefined ? fallback : rule(value, path, problems);

/** A measurement nobody took: missing, null or NaN all read as null. */
export const missingAsNull =
	<T>(rule: Rule<T>): Rule<T | null> =>
	(value, path, problems) =>
		value === undefined || value === null || (typeof value === 'number' && Number.isNaN(value)) ? null : rule(value, path, problems);

export function oneOf<const V extends readonly (string | number)[]>(values: V, message: string): Rule<V[number]> {
	return (value, path, problems) => {
		if ((typeof value === 'string' || typeof value === 'number') && values.includes(value)) return value as V[number];
		problems.push({ path, message });
		return values[0];
	};
}

/** Text, trimmed, at most `max` characters. */
export function text(max: number, tooLong: string, typeMessage?: string): Rule<string> {
	return (value, path, problems) => {
		if (typeof value !== 'string') {
			problems.push({ path, message: typeMessage ?? `Invalid input: expected string, received ${kindOf(value)}` });
			return '';
		}
		const trimmed = value.trim();
		if (trimmed.length > max) problems.push({ path, message: tooLong });
		return trimmed;
	};
}

export function boolean(message: string): Rule<boolean> {
	return (value, path, problems) => {
		if (typeof value === 'boolean') return value;
		problems.push({ path, message });
		return false;
	};
}

/** A list whose every item the rule reads; each length check adds its reason when the count fails it. */
export function array<T>(item: Rule<T>, typeMessage: string | undefined, ...lengthChecks: readonly NumberCheck[]): Rule<T[]> {
	return (value, path, problems) => {
		if (!Array.isArray(value)) {
			problems.push({ path, message: typeMessage ?? `Invalid input: expected array, received ${kindOf(value)}` });
			return [];
		}
		const items = value.map((v, i) => item(v, [...path, i], problems));
		for (const [ok, message] of lengthChecks) if (!ok(items.length)) problems.push({ path, message });
		return items;
	};
}

const kindOf = (value: unknown) => (value === null ? 'null' : Array.isArray(value) ? 'array' : typeof value);

/** An object with these fields; fields it does not name are left out of the result. */
export function object<S extends Record<string, Rule<unknown>>>(shape: S, typeMessage?: string): Rule<{ [K in keyof S]: RuleOutput<S[K]> }> {
	return (value, path, problems) => {
		const out: Record<string, unknown> = {};
		if (value === null || typeof value !== 'object' || Array.isArray(value)) {
			problems.push({ path, message: typeMessage ?? `Invalid input: expected object, received ${kindOf(value)}` });
			return out as { [K in keyof S]: RuleOutput<S[K]> };
		}
		const fields = value as Record<string, unknown>;
		for (const [key, rule] of Object.entries(shape)) {
			const read = rule(fields[key], [...path, key], problems);
			if (read !== undefined) out[key] = read;
		}
		return out as { [K in keyof S]: RuleOutput<S[K]> };
	};
}

/** One of several objects, told apart by the value of one field (`kind`). */
export function byKind<V extends Record<string, Rule<unknown>>>(key: string, variants: V, message: string): Rule<RuleOutput<V[keyof V]>> {
	return (value, path, problems) => {
		const tag = value !== null && typeof value === 'object' ? (value as Record<string, unknown>)[key] : undefined;
		if (typeof tag !== 'string' || !Object.hasOwn(variants, tag)) {
			problems.push({ path: value !== null && typeof value === 'object' && !Array.isArray(value) ? [...path, key] : path, message });
			return undefined as RuleOutput<V[keyof V]>;
		}
		return variants[tag](value, path, problems) as RuleOutput<V[keyof V]>;
	};
}

/** A value whose fields were read without a problem, checked as a whole; `refuse` records why it does not hold together. */
export function refine<T>(rule: Rule<T>, check: (value: T, refuse: (path: (string | number)[], message: string) => void) => void): Rule<T> {
	return (value, path, problems) => {
		const before = problems.length;
		const read = rule(value, path, problems);
		if (problems.length === before) check(read, (at, message) => problems.push({ path: [...path, ...at], message }));
		return read;
	};
}

/** The exact value, or the words for anything else. */
export function literal<const L extends string | number | boolean>(expected: L, message?: string): Rule<L> {
	return (value, path, problems) => {
		if (value !== expected) problems.push({ path, message: message ?? `Invalid input: expected ${JSON.stringify(expected)}` });
		return expected;
	};
}

/** The value the rule reads, or a RangeError whose message lists every reason in plain words. */
export function checkFigures<T>(rule: Rule<T>, input: unknown): T {
	const problems: Problem[] = [];
	const value = rule(input, [], problems);
	if (problems.length > 0) throw new RangeError(problems.map((p) => p.message).join(' '));
	return value;
}
