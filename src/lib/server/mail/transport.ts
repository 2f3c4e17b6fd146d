import { createTransport, type Transporter } from 'nodemailer';

import { config } from '../config';

type MailSettings = Pick<typeof config.mail, 'host' | 'port' | 'secure' | 'user' | 'pass' | 'from'>;

/** Read on every send, so a test can point mail at its own capture server. */
function mailSettings(): MailSettings {
	const { host, port, secure, user, pass, from } = config.mail;
	return { host, port, secure, user, pass, from };
}

let cached: { key: string; transporter: Transporter } | null = null;

function transporterFor(settings: MailSettings): Transporter {
	const key = JSON.stringify(settings);
	if (cached?.key === key) return cached.transporter;
	cached?.transporter.close();
	const transporter = createTransport({
		host: settings.host,
		port: settings.port,
		secure: settings.secure,
		auth: settings.user ? { user: settings.user, pass: settings.pass ?? '' } : undefined,
		connectionTimeout: 10_000,
		greetingTimeout: 10_000,
		socketTimeout: 20_000
	});
	cached = { key, transporter };
	return transporter;
}

export type OutgoingMail = { to: string; subject: string; text: string; html: string };
/** A message as sent from the queue: its Message-ID stays the same on every try. */
export type QueuedMail = OutgoingMail & { messageId?: string };

/** The mail server refused or could not be reached; the person asking should hear that it was not sent. */
export class MailNotSent extends Error {}

export async function sendMail(mail: QueuedMail): Promise<void> {
	const settings = mailSettings();
	try {
		await transporterFor(settings).sendMail({ from: settings.from, ...mail });
	} catch (err) {
		throw new MailNotSent(`The e-mail to ${mail.to} could not be sent: ${err instanceof Error ? err.message : String(err)}`);
	}
}
