import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { db } from '../../src/lib/server/db';
import { createVehicle, revisionById } from '../../src/lib/server/services/revisions';
import { SHARED_STATE_TTL_MS } from '../../src/lib/server/cache';
import { emptyContent } from '../../src/lib/domain/content/schema';
import { readingRules } from '../../src/lib/server/services/readingRules';

beforeAll(() => freshDatabase('shared_state'));
afterAll(() => closeDb());

const afterTheBound = () => new Promise((resolve) => setTimeout(resolve, SHARED_STATE_TTL_MS + 50));

describe('a revision hidden or shown again by another app server', () => {
	it('reads as hidden here within SHARED_STATE_TTL_MS, and as shown again after an unhide', async () => {
		const editor = await makeUser('editor');
		const { revisionId } = await createVehicle(emptyContent({ make: 'Ossendra', model: 'Tern', yearFrom: 2014, yearTo: 2018, body: 'sedan' }), editor);
		expect((await revisionById(revisionId))!.hidden).toBe(false);

		// The other server's write reaches the shared database only; nothing in this process hears of it.
		await db().query('UPDATE revisions SET hidden = 1 WHERE id = ?', { replacements: [revisionId] });
		await afterTheBound();
		expect((await revisionById(revisionId))!.hidden).toBe(true);

		await db().query('UPDATE revisions SET hidden = 0 WHERE id = ?', { replacements: [revisionId] });
		await afterTheBound();
		expect((await revisionById(revisionId))!.hidden).toBe(false);
	});
});

describe('the shop switching sign-off on through another app server', () => {
	it('reads as switched on here within SHARED_STATE_TTL_MS, and off again after', async () => {
		const write = (on: boolean) =>
			db().query("INSERT INTO settings (name, value) VALUES ('reviewBeforeShow', ?) ON DUPLICATE KEY UPDATE value = VALUES(value)", { replacements: [String(on)] });
		expect((await readingRules()).signOffRequired).toBe(false);
		await write(true);
		await afterTheBound();
		expect((await readingRules()).signOffRequired).toBe(true);
		await write(false);
		await afterTheBound();
		expect((await readingRules()).signOffRequired).toBe(false);
	});
});
