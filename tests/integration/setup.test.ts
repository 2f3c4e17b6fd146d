import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { AccountToken, User } from '../../src/lib/server/db/models';
import { hashToken } from '../../src/lib/server/services/accountTokens';
import { completeSetup, issueSetupLink, SETUP_LIFETIME_MS, setupLinkWorks } from '../../src/lib/server/services/setup';
import { authenticate, setUserStatus } from '../../src/lib/server/services/users';

beforeAll(() => freshDatabase('setup'));
afterAll(() => closeDb());

const tokenOf = (link: string) => link.slice(link.lastIndexOf('/') + 1);
const firstAdmin = { name: 'Owner Sample', email: 'Owner@Kickpanel.test', password: 'first-admin-pass', confirm: 'first-admin-pass' };

describe('the first admin of an empty install', () => {
	it('is made once through a link whose token is stored only as its hash', async () => {
		const older = await issueSetupLink();
		const issued = await issueSetupLink();
		expect(issued!.link).toMatch(/\/setup\/[A-Za-z0-9_-]{43}$/);
		const token = tokenOf(issued!.link);
		const row = await AccountToken.findOne({ where: { kind: 'setup', tokenHash: hashToken(token) } });
		expect(row).not.toBeNull();
		expect(JSON.stringify(await AccountToken.findAll({ raw: true }))).not.toContain(token);
		// Printing a new link retires the one before.
		expect(await setupLinkWorks(tokenOf(older!.link))).toBe(false);
		expect(await setupLinkWorks(token)).toBe(true);

		const refused = await completeSetup(token, { ...firstAdmin, confirm: 'something-else' }).catch((e) => e);
		expect(refused.fieldErrors).toEqual({ confirm: expect.stringMatching(/not the same/) });
		const noEmail = await completeSetup(token, { ...firstAdmin, email: 'owner' }).catch((e) => e);
		expect(noEmail.fieldErrors.email).toMatch(/valid e-mail/);

		const made = await completeSetup(token, firstAdmin);
		expect(made.email).toBe('owner@kickpanel.test');
		expect((await User.findByPk(made.userId))!.role).toBe('admin');
		expect((await authenticate('owner@kickpanel.test', 'first-admin-pass', '10.60.0.1')).ok).toBe(true);

		await expect(completeSetup(token, { ...firstAdmin, email: 'second@kickpanel.test' })).rejects.toMatchObject({ status: 404 });
		expect(await setupLinkWorks(token)).toBe(false);
		expect(await User.count()).toBe(1);
	});

	it('is not offered once an active admin exists', async () => {
		expect(await issueSetupLink()).toBeNull();
	});

	it('refuses an unused link once another admin was made by other means', async () => {
		const owner = await User.findOne({ where: { email: 'owner@kickpanel.test' } });
		await setUserStatus(owner!.id, 'disabled', 0);
		const issued = await issueSetupLink();
		expect(issued).not.toBeNull();
		await setUserStatus(owner!.id, 'active', 0);
		expect(await setupLinkWorks(tokenOf(issued!.link))).toBe(false);
		await expect(completeSetup(tokenOf(issued!.link), { ...firstAdmin, email: 'late@kickpanel.test' })).rejects.toMatchObject({ status: 404 });
	});

	it('stops working after an hour', async () => {
		const owner = await User.findOne({ where: { email: 'owner@kickpanel.test' } });
		await setUserStatus(owner!.id, 'disabled', 0);
		const now = new Date();
		const issued = await issueSetupLink(now);
		const later = new Date(now.getTime() + SETUP_LIFETIME_MS + 1);
		expect(await setupLinkWorks(tokenOf(issued!.link), later)).toBe(false);
		await expect(completeSetup(tokenOf(issued!.link), { ...firstAdmin, email: 'late@kickpanel.test' }, later)).rejects.toMatchObject({ status: 404 });
	});
});
