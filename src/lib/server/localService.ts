/** A local stand-in for a hosted service, started by scripts/services.ts in development and tests. */
export type LocalService = {
	start(): Promise<{ name: string; url: string; stop(): Promise<void> }>;
};
