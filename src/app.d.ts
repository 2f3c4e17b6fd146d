import type { SessionUser } from '$lib/domain/sessionUser';

declare global {
	namespace App {
		interface Error {
			message: string;
		}
		interface Locals {
			user: SessionUser | null;
			units: 'metric' | 'imperial';
			/** Stored HTML (UTF-8) spliced into the page by the handle hook. */
			fragments?: Record<string, Uint8Array>;
			/** Names the stored parts those fragments came from, for the page's ETag. */
			fragmentsTag?: string;
			/** A full page view's finished bytes, as fillStoredParts sent them (never written to afterwards). */
			filledPage?: Uint8Array<ArrayBuffer>;
			/** What this request's load functions returned, for the page memo. */
			viewData?: { layout?: unknown; page?: unknown };
		}
		interface PageData {
			user?: SessionUser | null;
		}
	}
}

export {};
