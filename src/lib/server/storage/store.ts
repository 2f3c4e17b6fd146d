/** What a stored object is: its size and type, without the bytes. */
export type StoredObjectInfo = { bytes: number; contentType: string };

/** A stored object ready to stream to a client. */
export type StoredObject = StoredObjectInfo & { body: ReadableStream<Uint8Array> };

/**
 * Where photo renditions live. Keys are derived from content hashes, so an object is written once
 * and never changed; there is deliberately no delete: old revisions keep pointing at their photos.
 */
export interface PhotoStore {
	put(key: string, bytes: Uint8Array, contentType: string): Promise<void>;
	get(key: string): Promise<StoredObject | null>;
	head(key: string): Promise<StoredObjectInfo | null>;
}
