import { AsyncLocalStorage } from 'node:async_hooks';
import { setFlagsFromString } from 'node:v8';
import { runInNewContext } from 'node:vm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { QueryTypes } from 'sequelize';
import { closeDb, freshDatabase } from '../helpers/database';
import { db } from '../../src/lib/server/db';

setFlagsFromString('--expose-gc');
const collectGarbage = runInNewContext('gc') as () => void;

beforeAll(() => freshDatabase('connection_context'));
afterAll(() => closeDb());

// A request's async context holds its whole event (data, rendered page); a pooled connection lives on after it.
const requests = new AsyncLocalStorage<{ id: number; page: Uint8Array }>();

async function settle() {
	for (let i = 0; i < 3; i++) {
		await new Promise((resolve) => setTimeout(resolve, 0));
		collectGarbage();
	}
}

/** Runs a query inside a request holding 1 MB and answers whether that request is still alive afterwards. */
async function requestOutlivesItsQuery(id: number): Promise<boolean> {
	const made = (() => {
		const request = { id, page: new Uint8Array(1024 * 1024) };
		const ref = new WeakRef(request);
		const answer = requests.run(request, async () => {
			const [row] = await db().query<{ n: number }>('SELECT ? AS n', { replacements: [id], type: QueryTypes.SELECT });
			// The caller reads its answer in its own context.
			return { n: Number(row.n), seenBy: requests.getStore()?.id };
		});
		return { ref, answer };
	})();
	expect(await made.answer).toEqual({ n: id, seenBy: id });
	delete (made as { answer?: unknown }).answer;
	await settle();
	return made.ref.deref() !== undefined;
}

describe('database connections and the requests that use them', () => {
	it('a connection opened for a request does not keep that request alive', async () => {
		await closeDb();
		expect(await requestOutlivesItsQuery(1)).toBe(false);
	});

	it('a pooled connection does not keep alive the last request that sent it a query', async () => {
		await db().query('SELECT 1', { type: QueryTypes.SELECT });
		expect(await requestOutlivesItsQuery(2)).toBe(false);
		expect(await requestOutlivesItsQuery(3)).toBe(false);
	});

	it('queries inside a transaction still answer on the transaction connection', async () => {
		const seen = await requests.run({ id: 4, page: new Uint8Array(1) }, () =>
			db().transaction(async (transaction) => {
				await db().query('CREATE TEMPORARY TABLE scratch (n INT)', { transaction });
				await db().query('INSERT INTO scratch VALUES (7)', { transaction });
				const [row] = await db().query<{ n: number }>('SELECT n FROM scratch', { transaction, type: QueryTypes.SELECT });
				return { n: row.n, id: requests.getStore()?.id };
			})
		);
		expect(seen).toEqual({ n: 7, id: 4 });
	});
});
