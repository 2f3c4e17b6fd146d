import { config } from '../config';
import { S3PhotoStore } from './s3';
import type { PhotoStore } from './store';

export type { PhotoStore, StoredObject, StoredObjectInfo } from './store';

let current: PhotoStore | null = null;

/** The store photos go to: the bucket the environment names, or the local fake by default. */
export function photoStore(): PhotoStore {
	current ??= new S3PhotoStore(config.s3);
	return current;
}

/** Points every later call at another store (tests run their own fake on a free port). */
export function usePhotoStore(store: PhotoStore): void {
	current = store;
}
