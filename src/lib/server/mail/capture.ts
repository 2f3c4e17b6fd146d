import { SMTPServer } from 'smtp-server';
import type { AddressInfo } from 'node:net';
import type { LocalService } from '../localService';
import { config } from '../config';
import { keepCaptured, outboxDir } from './outbox';
import { readMessage } from './rfc822';

const MAX_MESSAGE_BYTES = 10 * 1024 * 1024;

export type RunningCapture = { name: string; url: string; port: number; dir: string; stop(): Promise<void> };

/** A local SMTP server that accepts every message and keeps it as a JSON file, in place of a real mail service. */
export function startMailCapture(options: { port?: number; host?: string; dir?: string } = {}): Promise<RunningCapture> {
	const host = options.host ?? '127.0.0.1';
	const dir = options.dir ?? outboxDir();
	const server = new SMTPServer({
		name: 'kickpanel-capture',
		banner: 'Kickpanel local mail capture: nothing is delivered',
		disabledCommands: ['STARTTLS'],
		authOptional: true,
		allowInsecureAuth: true,
		size: MAX_MESSAGE_BYTES,
		logger: false,
		onAuth(_auth, _session, callback) {
			callback(null, { user: 'capture' });
		},
		onData(stream, session, callback) {
			const chunks: Buffer[] = [];
			stream.on('data', (chunk: Buffer) => chunks.push(chunk));
			stream.on('error', callback);
			stream.on('end', () => {
				if (stream.sizeExceeded) return callback(Object.assign(new Error('Message too large for the capture'), { responseCode: 552 }));
				const raw = Buffer.concat(chunks).toString('utf8');
				const from = session.envelope.mailFrom;
				keepCaptured(
					{
						receivedAt: new Date().toISOString(),
						envelope: { from: from ? from.address : null, to: session.envelope.rcptTo.map((r) => r.address) },
						raw,
						...readMessage(raw)
					},
					dir
				).then(
					() => callback(),
					(err: Error) => callback(err)
				);
			});
		}
	});
	const port = options.port ?? config.mail.capturePort;
	return new Promise((resolvePromise, reject) => {
		server.once('error', reject);
		server.listen(port, host, () => {
			server.off('error', reject);
			server.on('error', (err) => console.error('[mail capture]', err.message));
			const bound = (server.server.address() as AddressInfo).port;
			resolvePromise({
				name: 'mail capture',
				url: `smtp://${host}:${bound} → ${dir}`,
				port: bound,
				dir,
				stop: () => new Promise<void>((done) => server.close(() => done()))
			});
		});
	});
}

// With a real mail server configured, the capture stays off.
export const mailCapture: LocalService = {
	start: async () =>
		config.mail.configuredHost
			? { name: 'mail: SMTP_HOST is set, so no local capture', url: `smtp://${config.mail.configuredHost}`, stop: async () => {} }
			: startMailCapture()
};
