import { openDB, type DBSchema, type IDBPDatabase } from 'idb';
import type { WaitingKind } from '../domain/offlineOutbox';

// What the phone itself remembers between visits, in IndexedDB: the pages pinned for the day and
// the marks and changes made with no signal that wait to be sent.

export type Pin = { slug: string; title: string; day: string; addresses: string[] };

/** A form post made offline, kept whole so it can be sent later exactly as the form would have. */
export type WaitingPost = {
	id?: number;
	/** The form action's address, e.g. "/vehicles/…/trust?/flag". */
	action: string;
	fields: [string, string][];
	/** What it is, in words: "Flag on Driver seat space, height", "Change to Veldra Tarn …". */
	label: string;
	/** A mark unless said otherwise (posts kept before changes could wait carry none). */
	kind?: WaitingKind;
	slug: string;
	/** The page a change is to: its drafts on the device go once the change is sent. */
	vehicleId?: number;
	/** Who made it: it is sent only while that person is signed in on this phone. */
	by: number;
	madeAt: string;
	/** Set when the server refused it: the person sees why. */
	refusal?: string;
};

interface PhoneSchema extends DBSchema {
	pins: { key: string; value: Pin };
	outbox: { key: number; value: WaitingPost };
}

let opened: Promise<IDBPDatabase<PhoneSchema>> | null = null;

export function phoneStore(): Promise<IDBPDatabase<PhoneSchema>> {
	opened ??= openDB<PhoneSchema>('kickpanel-phone', 1, {
		upgrade(db) {
			db.createObjectStore('pins', { keyPath: 'slug' });
			db.createObjectStore('outbox', { keyPath: 'id', autoIncrement: true });
		}
	});
	return opened;
}
