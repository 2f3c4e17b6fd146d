// A shop's backup: the whole database as SQL (mariadb-dump from Debian's client package) and every photo
// object from the bucket (through the S3 SDK), in one dated folder with a manifest that says what is inside.
// Restoring puts both back into an empty install and checks the counts against the manifest.
import { spawn } from 'node:child_process';
import { createHash } from 'node:crypto';
import { createReadStream, createWriteStream } from 'node:fs';
import { mkdir, readFile, readdir, stat, writeFile } from 'node:fs/promises';
import { dirname, join, relative } from 'node:path';
import { pipeline } from 'node:stream/promises';
import { GetObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { QueryTypes } from 'sequelize';
import { db } from '../db';
import type { Config } from '../config';

type DbSettings = Config['db'];
type StoreSettings = Pick<Config['s3'], 'endpoint' | 'bucket' | 'region' | 'credentials' | 'forcePathStyle'>;

export const MANIFEST = 'manifest.json';
const DUMP = 'database.sql';
const PHOTOS = 'photos';

/** What a backup holds, written beside it: checked again on restore. */
export type Manifest = {
	format: 1;
	takenAt: string;
	database: string;
	/** Rows per table at the moment of the dump (the dump is one consistent snapshot). */
	tables: Record<string, number>;
	photos: { key: string; bytes: number; sha256: string; contentType: string }[];
};

/** A folder name for a backup taken at `at`, sortable: 2026-12-05T06-30-12Z. */
export const backupFolderName = (at: Date): string => at.toISOString().replace(/\.\d{3}Z$/, 'Z').replace(/:/g, '-');

function run(command: string, args: string[], env: Record<string, string>, io: { stdin?: string; stdout?: string }): Promise<void> {
	return new Promise((resolve, reject) => {
		const child = spawn(command, args, { env: { ...process.env, ...env }, stdio: ['pipe', 'pipe', 'pipe'] });
		let stderr = '';
		child.stderr.on('data', (d) => (stderr += d));
		child.on('error', reject);
		const done = new Promise<void>((res, rej) =>
			child.on('close', (code) => (code === 0 ? res() : rej(new Error(`${command} exited with ${code}: ${stderr.trim().slice(0, 500)}`))))
		);
		const steps: Promise<unknown>[] = [done];
		if (io.stdout) steps.push(pipeline(child.stdout, createWriteStream(io.stdout)));
		else child.stdout.resume();
		if (io.stdin) steps.push(pipeline(createReadStream(io.stdin), child.stdin));
		else child.stdin.end();
		Promise.all(steps).then(() => resolve(), reject);
	});
}

const clientArgs = (d: DbSettings) => ['--host', d.host, '--port', String(d.port), '--user', d.user, '--protocol=TCP'];

async function tableCounts(): Promise<Record<string, number>> {
	const tables = await db().query<{ name: string }>(
		"SELECT TABLE_NAME AS name FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_TYPE = 'BASE TABLE' ORDER BY TABLE_NAME",
		{ type: QueryTypes.SELECT }
	);
	const counts: Record<string, number> = {};
	for (const { name } of tables) {
		const [row] = await db().query<{ n: number | string }>(`SELECT COUNT(*) AS n FROM \`${name.replace(/`/g, '')}\``, { type: QueryTypes.SELECT });
		counts[name] = Number(row.n);
	}
	return counts;
}

function storeClient(s: StoreSettings): S3Client {
	return new S3Client({ endpoint: s.endpoint, region: s.region, forcePathStyle: s.forcePathStyle, credentials: s.credentials });
}

async function* bucketKeys(client: S3Client, bucket: string): AsyncGenerator<string> {
	let token: string | undefined;
	do {
		const page = await client.send(new ListObjectsV2Command({ Bucket: bucket, ContinuationToken: token }));
		for (const o of page.Contents ?? []) if (o.Key) yield o.Key;
		token = page.IsTruncated ? page.NextContinuationToken : undefined;
	} while (token);
}

/** Writes a backup into `root/<date>/` and answers the folder. */
export async function takeBackup(root: string, settings: { db: DbSettings; s3: StoreSettings }, at = new Date()): Promise<{ folder: string; manifest: Manifest }> {
	const folder = join(root, backupFolderName(at));
	await mkdir(join(folder, PHOTOS), { recursive: true });
	const tables = await tableCounts();
	await run(
		'mariadb-dump',
		[...clientArgs(settings.db), '--single-transaction', '--quick', '--hex-blob', '--routines', '--triggers', '--default-character-set=utf8mb4', settings.db.name],
		{ MYSQL_PWD: settings.db.password },
		{ stdout: join(folder, DUMP) }
	);
	const client = storeClient(settings.s3);
	const photos: Manifest['photos'] = [];
	try {
		for await (const key of bucketKeys(client, settings.s3.bucket)) {
			const res = await client.send(new GetObjectCommand({ Bucket: settings.s3.bucket, Key: key }));
			const bytes = Buffer.from(await res.Body!.transformToByteArray());
			const path = join(folder, PHOTOS, key);
			await mkdir(dirname(path), { recursive: true });
			await writeFile(path, bytes);
			photos.push({ key, bytes: bytes.length, sha256: createHash('sha256').update(bytes).digest('hex'), contentType: res.ContentType ?? 'application/octet-stream' });
		}
	} finally {
		client.destroy();
	}
	const manifest: Manifest = { format: 1, takenAt: at.toISOString(), database: settings.db.name, tables, photos };
	await writeFile(join(folder, MANIFEST), JSON.stringify(manifest, null, 2));
	return { folder, manifest };
}

async function filesUnder(dir: string): Promise<string[]> {
	const out: string[] = [];
	for (const entry of await readdir(dir, { withFileTypes: true })) {
		const path = join(dir, entry.name);
		if (entry.isDirectory()) out.push(...(await filesUnder(path)));
		else out.push(path);
	}
	return out;
}

export class RestoreRefused extends Error {}

/**
 * Loads a backup into an empty database and bucket. Refuses a database that already has tables, a folder whose
 * photos do not match the manifest, and reports the counts it finds afterwards.
 */
export async function restoreBackup(folder: string, settings: { db: DbSettings; s3: StoreSettings }): Promise<{ tables: Record<string, number>; photos: number }> {
	const manifest = JSON.parse(await readFile(join(folder, MANIFEST), 'utf8')) as Manifest;
	if (manifest.format !== 1) throw new RestoreRefused(`This backup's format (${manifest.format}) is not one this version reads.`);
	const [existing] = await db().query<{ n: number | string }>(
		"SELECT COUNT(*) AS n FROM information_schema.TABLES WHERE TABLE_SCHEMA = DATABASE() AND TABLE_TYPE = 'BASE TABLE'",
		{ type: QueryTypes.SELECT }
	);
	if (Number(existing.n) > 0) throw new RestoreRefused(`The database "${settings.db.name}" is not empty; restore into a new, empty database.`);

	const files = (await filesUnder(join(folder, PHOTOS))).map((p) => relative(join(folder, PHOTOS), p).split('\\').join('/'));
	const listed = new Map(manifest.photos.map((p) => [p.key, p]));
	for (const key of files) {
		const entry = listed.get(key);
		const bytes = await readFile(join(folder, PHOTOS, key));
		if (!entry || createHash('sha256').update(bytes).digest('hex') !== entry.sha256) throw new RestoreRefused(`Photo object ${key} does not match the backup's manifest.`);
	}
	if (files.length !== manifest.photos.length) throw new RestoreRefused(`The backup lists ${manifest.photos.length} photo objects but holds ${files.length}.`);

	await run('mariadb', [...clientArgs(settings.db), '--default-character-set=utf8mb4', settings.db.name], { MYSQL_PWD: settings.db.password }, { stdin: join(folder, DUMP) });
	const client = storeClient(settings.s3);
	try {
		for (const { key, contentType } of manifest.photos) {
			const path = join(folder, PHOTOS, key);
			await client.send(new PutObjectCommand({ Bucket: settings.s3.bucket, Key: key, Body: await readFile(path), ContentLength: (await stat(path)).size, ContentType: contentType }));
		}
	} finally {
		client.destroy();
	}
	const tables = await tableCounts();
	for (const [name, n] of Object.entries(manifest.tables)) {
		if (tables[name] !== n) throw new RestoreRefused(`After loading, table ${name} has ${tables[name] ?? 0} rows; the backup had ${n}.`);
	}
	return { tables, photos: manifest.photos.length };
}
