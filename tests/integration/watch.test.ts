import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeDb, freshDatabase } from '../helpers/database';
import { makeUser } from '../helpers/users';
import { startTestOutbox, type TestOutbox } from '../helpers/mail';
import { PendingNotice, Vehicle } from '../../src/lib/server/db/models';
import { emptyContent, type VehicleContent } from '../../src/lib/domain/content/schema';
import { createVehicle, revisionById, saveRevision, setRevisionHidden } from '../../src/lib/server/services/revisions';
import { setUserStatus } from '../../src/lib/server/services/users';
import {
	isWatching,
	noticesSettled,
	sendDigests,
	setNoticePreferences,
	startWatchNotices,
	unwatchPage,
	watchlist,
	watchPage
} from '../../src/lib/server/services/watch';
import { config } from '../../src/lib/server/config';
import type { SessionUser } from '../../src/lib/domain/sessionUser';

let outbox: TestOutbox;
let stopNotices: () => void;
let writer: SessionUser;
let quietWriter: SessionUser;
let moderator: SessionUser;
let counterStaff: SessionUser;
let digestReader: SessionUser;
let leaver: SessionUser;
let bystander: SessionUser;
let admin: SessionUser;
let vehicleId: number;
let slug: string;
const HOUR_MS = 60 * 60 * 1000;

const identity = { make: 'Varnholt', model: 'Pellar', yearFrom: 2008, yearTo: 2012, body: 'wagon' as const };

async function edit(author: SessionUser, notes: string, summary: string) {
	const vehicle = await Vehicle.findByPk(vehicleId);
	const latest = await revisionById(Number(vehicle!.latestRevisionId));
	const content: VehicleContent = structuredClone(latest!.content);
	content.seats.notes = notes;
	const saved = await saveRevision(vehicleId, { baseRevisionId: latest!.id, content, summary }, author);
	await noticesSettled();
	return { revisionId: saved.revisionId, parentId: latest!.id };
}

beforeAll(async () => {
	await freshDatabase('watch');
	outbox = await startTestOutbox();
	stopNotices = startWatchNotices();
	writer = await makeUser('editor', 'Writer Sample');
	quietWriter = await makeUser('editor', 'Quiet Sample');
	moderator = await makeUser('moderator', 'Lead Sample');
	counterStaff = await makeUser('viewer', 'Counter Sample');
	digestReader = await makeUser('viewer', 'Digest Sample');
	leaver = await makeUser('viewer', 'Leaver Sample');
	bystander = await makeUser('viewer', 'Bystander Sample');
	admin = await makeUser('admin');
	await setNoticePreferences(quietWriter.id, { watchOwnEdits: false, noticeMode: 'immediate' });
	await setNoticePreferences(digestReader.id, { watchOwnEdits: true, noticeMode: 'digest' });
});
afterAll(async () => {
	stopNotices();
	await outbox.stop();
	await closeDb();
});

describe('watching pages', () => {
	it('watches a page for its author on creation, unless they turned that off', async () => {
		const created = await createVehicle(emptyContent(identity), writer);
		slug = created.slug;
		vehicleId = (await Vehicle.findOne({ where: { slug } }))!.id;
		await noticesSettled();
		expect(await isWatching(writer.id, vehicleId)).toBe(true);
		for (const u of [counterStaff, digestReader, leaver]) await watchPage(u.id, vehicleId);
		await watchPage(counterStaff.id, vehicleId);
		expect(await isWatching(counterStaff.id, vehicleId)).toBe(true);
		expect(await outbox.all()).toHaveLength(0);
	});

	it('sends a notice with the compare link to watchers other than the editor, and nothing to the disabled', async () => {
		await setUserStatus(leaver.id, 'disabled', admin.id);
		const change = await edit(writer, 'Rear bench lifts out with two 10 mm bolts.', 'rear bench access');
		const compare = `${config.origin}/vehicles/${slug}/compare?from=${change.parentId}&to=${change.revisionId}`;

		const [notice, ...more] = await outbox.to(counterStaff.email);
		expect(more).toHaveLength(0);
		expect(notice.subject).toBe('Writer Sample updated Varnholt Pellar 2008–2012');
		expect(notice.text).toContain(compare);
		expect(notice.text).toContain('rear bench access');
		expect(notice.html).toContain(compare.replace(/&/g, '&amp;'));

		expect(await outbox.to(writer.email)).toHaveLength(0);
		expect(await outbox.to(leaver.email)).toHaveLength(0);
		expect(await outbox.to(bystander.email)).toHaveLength(0);
		expect(await outbox.to(digestReader.email)).toHaveLength(0);
	});

	it('tells the first editor about a second editor, who does not start watching when they turned that off', async () => {
		const change = await edit(quietWriter, 'Tray under the passenger seat is 80 mm deep.', 'passenger tray depth');
		expect(await isWatching(quietWriter.id, vehicleId)).toBe(false);
		const toWriter = await outbox.to(writer.email);
		expect(toWriter).toHaveLength(1);
		expect(toWriter[0].text).toContain(`from=${change.parentId}&to=${change.revisionId}`);
		expect(await outbox.to(quietWriter.email)).toHaveLength(0);
		expect(await outbox.to(counterStaff.email)).toHaveLength(2);
	});

	it('sends nothing for hiding or unhiding a revision', async () => {
		const before = (await outbox.all()).length;
		const first = (await Vehicle.findByPk(vehicleId))!.latestRevisionId;
		await edit(moderator, 'Tray under the passenger seat is 82 mm deep.', 'measured again');
		const afterEdit = (await outbox.all()).length;
		await setRevisionHidden(Number(first), true, 'test of hiding', moderator);
		await setRevisionHidden(Number(first), false, 'test of hiding', moderator);
		await noticesSettled();
		expect((await outbox.all()).length).toBe(afterEdit);
		expect(afterEdit).toBeGreaterThan(before);
	});

	it('gathers digest readers’ notices into one mail a day', async () => {
		const queued = await PendingNotice.count({ where: { userId: digestReader.id, sentAt: null } });
		expect(queued).toBe(3);
		const now = Date.now();
		expect(await sendDigests(new Date(now))).toBe(0);
		expect(await sendDigests(new Date(now + 12 * HOUR_MS))).toBe(0);
		expect(await sendDigests(new Date(now + 25 * HOUR_MS))).toBe(1);
		const [digest, ...rest] = await outbox.to(digestReader.email);
		expect(rest).toHaveLength(0);
		expect(digest.subject).toBe('Today on the cars you follow: 3 updates to 1 car');
		expect(digest.text.match(/compare\?from=\d+&to=\d+/g)).toHaveLength(3);
		expect(digest.text).toContain('rear bench access');
		expect(digest.text).toContain('passenger tray depth');
		expect(await sendDigests(new Date(now + 26 * HOUR_MS))).toBe(0);

		// A change right after a digest waits a full day for the next one.
		await edit(writer, 'Rear bench lifts out with two 10 mm bolts; mind the belt buckles.', 'buckles');
		expect(await sendDigests(new Date(now + 30 * HOUR_MS))).toBe(0);
		expect(await sendDigests(new Date(now + 49 * HOUR_MS))).toBe(1);
		expect(await outbox.to(digestReader.email)).toHaveLength(2);
	});

	it('stops notices after unwatching, and lists watched pages with their latest change', async () => {
		await unwatchPage(counterStaff.id, vehicleId);
		const before = (await outbox.to(counterStaff.email)).length;
		const change = await edit(writer, 'Bench bolts are 10 mm, torque as the maker says.', 'bolt note');
		expect((await outbox.to(counterStaff.email)).length).toBe(before);

		const list = await watchlist(writer);
		expect(list).toHaveLength(1);
		expect(list[0]).toMatchObject({
			vehicle: { id: vehicleId, slug, title: 'Varnholt Pellar 2008–2012' },
			latest: { revisionId: change.revisionId, parentId: change.parentId, by: 'Writer Sample', summary: 'bolt note' },
			newerAwaitingReview: false
		});
		expect(await watchlist(counterStaff)).toEqual([]);
	});
});
