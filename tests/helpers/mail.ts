// Runs the local SMTP capture in the test process on a free port and points the app's mail settings at it.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { startMailCapture, type RunningCapture } from '../../src/lib/server/mail/capture';
import { listCaptured, type CapturedMail } from '../../src/lib/server/mail/outbox';
import { config } from '../../src/lib/server/config';

export type TestOutbox = {
	capture: RunningCapture;
	to(address: string): Promise<CapturedMail[]>;
	all(): Promise<CapturedMail[]>;
	stop(): Promise<void>;
};

export async function startTestOutbox(): Promise<TestOutbox> {
	const dir = mkdtempSync(join(tmpdir(), 'kickpanel-outbox-'));
	const capture = await startMailCapture({ port: 0, dir });
	config.mail.host = '127.0.0.1';
	config.mail.port = capture.port;
	config.mail.captureDir = dir;
	return {
		capture,
		to: (address) => listCaptured({ dir, to: address }),
		all: () => listCaptured({ dir }),
		stop: async () => {
			await capture.stop();
			rmSync(dir, { recursive: true, force: true });
		}
	};
}

/** The token of the first /invite/… or /reset/… link in a mail's plain text. */
export function linkToken(mail: CapturedMail, kind: 'invite' | 'reset'): string {
	const match = mail.text.match(new RegExp(`https?://[^\\s]+/${kind}/([A-Za-z0-9_-]{43})(?![A-Za-z0-9_-])`));
	if (!match) throw new Error(`no ${kind} link in: ${mail.text}`);
	return match[1];
}
