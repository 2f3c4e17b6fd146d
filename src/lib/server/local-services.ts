import { mailCapture } from './mail/capture';
import { objectStoreFake } from './storage/fake';
import { vinDecoderFake } from './vin/fake';
import type { LocalService } from './localService';

// Each stand-in registers here: the VIN decoder fake, the object-store fake, the mail capture.
export const localServices: LocalService[] = [mailCapture, objectStoreFake, vinDecoderFake];
