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

/** A page row changed without a new revision (protection). */
const vehicleListeners = new Set<(vehicleId: number) => void>();

export function onVehicleChanged(listener: (vehicleId: number) => void): () => void {
	vehicleListeners.add(listener);
	return () => vehicleListeners.delete(listener);
}

export function announceVehicleChange(vehicleId: number): void {
	for (const listener of vehicleListeners) listener(vehicleId);
}

/** A trust mark (a confirmation or a flag) was made on a page: copies of its marks must go. */
const markListeners = new Set<(vehicleId: number) => void>();

export function onMarksChanged(listener: (vehicleId: number) => void): () => void {
	markListeners.add(listener);
	return () => markListeners.delete(listener);
}

export function announceMarks(vehicleId: number): void {
	for (const listener of markListeners) listener(vehicleId);
}

/** A person's account, role, status, block, password or preferences changed: cached copies must go. */
const accountListeners = new Set<(userId: number) => void>();

export function onAccountChanged(listener: (userId: number) => void): () => void {
	accountListeners.add(listener);
	return () => accountListeners.delete(listener);
}

export function announceAccountChange(userId: number): void {
	for (const listener of accountListeners) listener(userId);
}
