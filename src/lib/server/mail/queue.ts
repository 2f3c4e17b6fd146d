// The mail queue: every message is stored in MariaDB before anyone tries to send it, then sent from there.
// A mail server that is down delays a message, never loses it; the claim on each row keeps two app servers
// (or two timers) from sending one message twice, and the stable Message-ID lets a receiving server drop a
// copy sent again after a crash between "sent" and "marked sent".
import { logFailure } from '../observability/log';
import { randomBytes } from 'node:crypto';
import { QueryTypes, type Transaction } from 'sequelize';
import { db } from '../db';
import { config } from '../config';
import { sendMail, type OutgoingMail } from './transport';

/** The first retry comes after this long, each later one after twice the last, up to RETRY_MAX_MS. */
export const RETRY_FIRST_MS = 30_000;
export const RETRY_MAX_MS = 30 * 60_000;
/** A claim older than this is taken to belong to a server that stopped; the message is tried again. */
export const CLAIM_MS = 2 * 60_000;

export const retryDelayMs = (attempts: number): number => Math.min(RETRY_FIRST_MS * 2 ** Math.max(0, attempts - 1), RETRY_MAX_MS);

function messageId(): string {
	const host = new URL(config.origin).hostname || 'kickpanel.invalid';
	return `<${Date.now().toString(36)}.${randomBytes(9).toString('hex')}@${host}>`;
}

/** Stores a message for sending; pass the transaction of the change that asks for it, so both land or neither. */
export async function queueMail(mail: OutgoingMail, transaction?: Transaction, now = new Date()): Promise<number> {
	const [id] = await db().query(
		`INSERT INTO mail_queue (recipient, subject, text_body, html_body, message_id, next_attempt_at, created_at)
		 VALUES (:to, :subject, :text, :html, :messageId, :now, :now)`,
		{ replacements: { ...mail, messageId: messageId(), now }, type: QueryTypes.INSERT, transaction }
	);
	return Number(id);
}

type QueuedRow = { id: number | string; recipient: string; subject: string; text_body: string; html_body: string; message_id: string; attempts: number };

/** Claims due messages (or the given ones, when due) for this call alone. */
async function claimDue(now: Date, limit: number, ids?: number[]): Promise<QueuedRow[]> {
	const claim = randomBytes(8).toString('hex');
	const only = ids ? `AND id IN (${ids.map(Number).filter(Number.isInteger).join(',') || 'NULL'})` : '';
	await db().query(
		`UPDATE mail_queue SET claim = :claim, claimed_until = :until
		 WHERE sent_at IS NULL AND next_attempt_at <= :now AND (claimed_until IS NULL OR claimed_until < :now) ${only}
		 ORDER BY id LIMIT ${Math.max(1, Math.floor(limit))}`,
		{ replacements: { claim, now, until: new Date(now.getTime() + CLAIM_MS) } }
	);
	return db().query<QueuedRow>(
		'SELECT id, recipient, subject, text_body, html_body, message_id, attempts FROM mail_queue WHERE claim = :claim AND sent_at IS NULL ORDER BY id',
		{ replacements: { claim }, type: QueryTypes.SELECT }
	);
}

export type Delivery = { sent: number[]; waiting: number[] };

/**
 * Sends what is due. A message the server refuses or cannot take stays queued with its next try pushed back
 * (30 s, 1 min, 2 min … up to 30 min).
 */
export async function deliverQueuedMail(options: { ids?: number[]; now?: Date; limit?: number } = {}): Promise<Delivery> {
	const now = options.now ?? new Date();
	const rows = await claimDue(now, options.limit ?? 100, options.ids);
	const result: Delivery = { sent: [], waiting: [] };
	for (const row of rows) {
		const id = Number(row.id);
		try {
			await sendMail({ to: row.recipient, subject: row.subject, text: row.text_body, html: row.html_body, messageId: row.message_id });
			await db().query('UPDATE mail_queue SET sent_at = :at, claim = NULL, claimed_until = NULL, attempts = attempts + 1, last_error = NULL WHERE id = :id', {
				replacements: { id, at: new Date() }
			});
			result.sent.push(id);
		} catch (err) {
			const attempts = Number(row.attempts) + 1;
			await db().query(
				'UPDATE mail_queue SET claim = NULL, claimed_until = NULL, attempts = :attempts, next_attempt_at = :next, last_error = :error WHERE id = :id',
				{ replacements: { id, attempts, next: new Date(now.getTime() + retryDelayMs(attempts)), error: (err instanceof Error ? err.message : String(err)).slice(0, 500) } }
			);
			result.waiting.push(id);
		}
	}
	return result;
}

/** Messages stored and not yet sent: what an operator watches. */
export async function mailQueueDepth(): Promise<number> {
	const [row] = await db().query<{ n: number | string }>('SELECT COUNT(*) AS n FROM mail_queue WHERE sent_at IS NULL', { type: QueryTypes.SELECT });
	return Number(row?.n ?? 0);
}

let timer: NodeJS.Timeout | null = null;
let sending = false;

/** Sends due mail now (once at a time in this process); failures are logged, the rows stay queued. */
export function kickMailQueue(): void {
	if (sending) return;
	sending = true;
	deliverQueuedMail()
		.catch((err) => logFailure('mail queue', err))
		.finally(() => (sending = false));
}

/** Looks for due mail every MAIL_QUEUE_INTERVAL_MS; returns the stop function. */
export function startMailQueue(intervalMs = config.mail.queueIntervalMs): () => void {
	if (timer) clearInterval(timer);
	timer = setInterval(kickMailQueue, intervalMs);
	timer.unref();
	return () => {
		if (timer) clearInterval(timer);
		timer = null;
	};
}
