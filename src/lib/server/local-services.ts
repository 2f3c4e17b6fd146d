import { mailCapture } from './mail/capture';
import { objectStoreFake } from './storage/fake';
import { vinDecoderFake } from './vin/fake';

/** A local stand-in for a hosted service, started by scripts/services.ts in development and tests. */
export type LocalService = {
	start(): Promise<{ name: string; url: string; stop(): Promise<void> }>;
};

// Each stand-in registers here: the VIN decoder fake, the object-store fake, the mail capture.
export const localServices: LocalService[] = [mailCapture, objectStoreFake, vinDecoderFake];
