import { logFailure } from './observability/log';
/** In-process notices after a revision is committed: the search index and watchers listen here. */
export type RevisionWritten = {
	kind: 'save' | 'restore' | 'hide' | 'unhide' | 'create' | 'review';
	vehicleId: number;
	revisionId: number;
	authorId: number;
};

type Listener = (event: RevisionWritten) => void | Promise<void>;
const listeners = new Set<Listener>();

export function onRevisionWritten(listener: Listener): () => void {
	listeners.add(listener);
	return () => listeners.delete(listener);
}

export async function announceRevision(event: RevisionWritten): Promise<void> {
	for (const listener of listeners) {
		try {
			await listener(event);
		} catch (err) {
			logFailure('revision listener failed', err);
		}
	}
}

/** A notice by id that cached copies must go: listeners run at once, in this process. */
function notice() {
	const listeners = new Set<(id: number) => void>();
	return {
		on(listener: (id: number) => void): () => void {
			listeners.add(listener);
			return () => listeners.delete(listener);
		},
		announce(id: number): void {
			for (const listener of listeners) listener(id);
		}
	};
}

/** A page row changed without a new revision (protection). */
const vehicleChanged = notice();
export const onVehicleChanged = vehicleChanged.on;
export const announceVehicleChange = vehicleChanged.announce;

/** A trust mark (a confirmation or a flag) was made on a page: copies of its marks must go. */
const marksChanged = notice();
export const onMarksChanged = marksChanged.on;
export const announceMarks = marksChanged.announce;

/** A person's account, role, status, block, password or preferences changed: cached copies must go. */
const accountChanged = notice();
export const onAccountChanged = accountChanged.on;
export const announceAccountChange = accountChanged.announce;
