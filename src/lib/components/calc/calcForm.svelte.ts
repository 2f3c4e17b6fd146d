import { afterNavigate, replaceState } from '$app/navigation';
import { page } from '$app/state';
import { fieldsFrom, queryOf } from './query';

/**
 * A calculator's fields, read from the address and kept in it as they change, so a result can be
 * shared and the page works as a plain GET form without scripts. Call it while a page starts.
 */
export function calcForm<K extends string>(path: string, defaults: Record<K, string>) {
	const fields = $state<Record<K, string>>(fieldsFrom(page.url.searchParams, defaults));
	let scripted = $state(false);
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
		}
	};
}
