import { createTransport, type Transporter } from 'nodemailer';

export type MailSettings = {
	host: string;
	port: number;
	secure: boolean;
	user: string | null;
	pass: string | null;
	from: string;
};

function portFrom(raw: string | undefined, fallback: number): number {
	if (!raw) return fallback;
	const n = Number(raw);
	if (!Number.isInteger(n) || n < 1 || n > 65535) throw new Error(`SMTP_PORT must be a port number, got "${raw}"`);
	return n;
}

/** Read from the environment each time, so a test can point mail at its own capture server. */
export function mailSettings(env = process.env): MailSettings {
	return {
		host: env.SMTP_HOST || '127.0.0.1',
		port: portFrom(env.SMTP_PORT || env.SMTP_CAPTURE_PORT, 2525),
		secure: env.SMTP_SECURE === 'true' || env.SMTP_SECURE === '1',
		user: env.SMTP_USER || null,
		pass: env.SMTP_PASS || null,
		from: env.MAIL_FROM || 'Kickpanel <no-reply@kickpanel.test>'
	};
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

/** The mail server refused or could not be reached; the person asking should hear that it was not sent. */
export class MailNotSent extends Error {}

export async function sendMail(mail: OutgoingMail): Promise<void> {
	const settings = mailSettings();
	try {
		await transporterFor(settings).sendMail({ from: settings.from, ...mail });
	} catch (err) {
		throw new MailNotSent(`The e-mail to ${mail.to} could not be sent: ${err instanceof Error ? err.message : String(err)}`);
	}
}
