import { mkdir, readdir, readFile, writeFile } from 'node:fs/promises';
import { randomBytes } from 'node:crypto';
import { join, resolve } from 'node:path';
import type { ReadMessage } from './rfc822';
import { config } from '../config';

/** A message the local capture received: what was said on the wire, and a reading of it for people. */
export type CapturedMail = ReadMessage & {
	id: string;
	receivedAt: string;
	envelope: { from: string | null; to: string[] };
	raw: string;
};

/** Both the app and the capture resolve this from the project root, so they agree without extra settings. */
export function outboxDir(): string {
	return resolve(process.cwd(), config.mail.captureDir);
}

const ID_PATTERN = /^[0-9]{13}-[0-9a-f]{8}$/;

export async function keepCaptured(mail: Omit<CapturedMail, 'id'>, dir = outboxDir()): Promise<CapturedMail> {
	await mkdir(dir, { recursive: true });
	const id = `${Date.parse(mail.receivedAt)}-${randomBytes(4).toString('hex')}`;
	const kept = { id, ...mail };
	await writeFile(join(dir, `${id}.json`), JSON.stringify(kept, null, 2));
	return kept;
}

/** Newest first. Missing folder means nothing was captured yet. */
export async function listCaptured(options: { dir?: string; limit?: number; to?: string } = {}): Promise<CapturedMail[]> {
	const dir = options.dir ?? outboxDir();
	let names: string[];
	try {
		names = await readdir(dir);
	} catch {
		return [];
	}
	const ids = names
		.filter((n) => n.endsWith('.json'))
		.map((n) => n.slice(0, -5))
		.filter((id) => ID_PATTERN.test(id))
		.sort()
		.reverse();
	const out: CapturedMail[] = [];
	for (const id of ids) {
		const mail = await capturedById(id, dir);
		if (!mail) continue;
		if (options.to && !mail.envelope.to.some((t) => t.toLowerCase() === options.to!.toLowerCase())) continue;
		out.push(mail);
		if (out.length >= (options.limit ?? 200)) break;
	}
	return out;
}

export async function capturedById(id: string, dir = outboxDir()): Promise<CapturedMail | null> {
	if (!ID_PATTERN.test(id)) return null;
	try {
		return JSON.parse(await readFile(join(dir, `${id}.json`), 'utf8')) as CapturedMail;
	} catch {
		return null;
	}
}
