import { afterNavigate, replaceState } from '$app/navigation';
import { page } from '$app/state';
import type { Fields, Read } from '../../domain/calcInput';
import { fieldsFrom, queryOf } from './query';

/**
 * A calculator's fields, read from the address and kept in it as they change, so a result can be
 * shared and the page works as a plain GET form without scripts; `read` is the form read by its
 * reader, `errors` one message per field. Call it while a page starts.
 */
export function calcForm<K extends string, T>(path: string, defaults: Record<K, string>, reader: (f: Fields<K>) => Read<K, T>) {
	const fields = $state<Record<K, string>>(fieldsFrom(page.url.searchParams, defaults));
	let scripted = $state(false);
	const read = $derived(reader(fields));
	const errors = $derived<Partial<Record<K, string>>>(read.ok ? {} : read.errors);
	// After the first navigation: the router takes replaceState from then on.
	afterNavigate(() => (scripted = true));
	$effect(() => {
		const next = queryOf(fields);
		if (scripted && next !== page.url.search) replaceState(`${path}${next}`, page.state);
	});
	return {
		fields,
		get scripted() {
			return scripted;
		},
		get read() {
			return read;
		},
		get errors() {
			return errors;
		}
	};
}

/** A figure to `digits` decimals, without trailing zeros, with thousands separators. */
export const fixed = (x: number, digits = 1): string => Number(x.toFixed(digits)).toLocaleString('en');
