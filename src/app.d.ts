import type { SessionUser } from '$lib/server/auth/guard';

declare global {
	namespace App {
		interface Error {
			message: string;
		}
		interface Locals {
			user: SessionUser | null;
			units: 'metric' | 'imperial';
		}
		interface PageData {
			user?: SessionUser | null;
		}
	}
}

export {};
