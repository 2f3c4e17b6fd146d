import { logFailure } from '../observability/log';
import { Op, type Transaction } from 'sequelize';
import { db } from '../db';
import { NotificationPreference, PendingNotice, User, Watch, type NoticeMode } from '../db/models';
import type { SessionUser } from '../../domain/sessionUser';
import { config } from '../config';
import { deliverQueuedMail, queueMail } from '../mail/queue';
import { changeNoticeMail, digestMail, type ChangeLine } from '../mail/templates';
import { onRevisionWritten, type RevisionWritten } from '../events';
import { revisionById } from './revisions';
import { vehicleById, type VehicleSummary } from './vehicles';
import { mayRead, pageRevision } from './visibility';
import { mayReadRevision, readsUnsignedOff } from '../../domain/visibility';
import { readingRules } from './readingRules';
import { shopSettings } from './settings';
import { ServiceError } from '../errors';
import { SHARED_STATE_TTL_MS, lookupCache } from '../cache';

// The pages each person watches, read in one query and kept briefly: every page view asks.
const watchedBy = lookupCache<number, Set<number>>(SHARED_STATE_TTL_MS);

const HOUR_MS = 60 * 60 * 1000;
const DIGEST_INTERVAL_MS = 24 * HOUR_MS;
// The digest check runs hourly, so a digest may fall due a little before the full day has passed.
const DIGEST_SLACK_MS = 30 * 60 * 1000;

export type NoticePreferences = { watchOwnEdits: boolean; noticeMode: NoticeMode };
const DEFAULT_PREFERENCES: NoticePreferences = { watchOwnEdits: true, noticeMode: 'immediate' };

export async function noticePreferences(userId: number): Promise<NoticePreferences> {
	const row = await NotificationPreference.findByPk(userId);
	return row ? { watchOwnEdits: !!row.watchOwnEdits, noticeMode: row.noticeMode } : { ...DEFAULT_PREFERENCES };
}

/** Notices already waiting follow the new choice, so switching to "at once" sends what the digest held. */
export async function setNoticePreferences(userId: number, prefs: NoticePreferences): Promise<void> {
	const row = await NotificationPreference.findByPk(userId);
	if (row) await row.update(prefs);
	else await NotificationPreference.create({ userId, ...prefs });
	await PendingNotice.update({ mode: prefs.noticeMode }, { where: { userId, sentAt: null } });
	if (prefs.noticeMode === 'immediate') kickDelivery();
}

export async function watchPage(userId: number, vehicleId: number): Promise<void> {
	if (!(await vehicleById(vehicleId))) throw new ServiceError('That vehicle page no longer exists.', 404);
	await Watch.bulkCreate([{ userId, vehicleId }], { ignoreDuplicates: true });
	watchedBy.delete(userId);
}

export async function unwatchPage(userId: number, vehicleId: number): Promise<void> {
	await Watch.destroy({ where: { userId, vehicleId } });
	watchedBy.delete(userId);
}

export async function isWatching(userId: number, vehicleId: number): Promise<boolean> {
	const watched = await watchedBy.get(userId, async () => {
		const rows = await Watch.findAll({ where: { userId }, attributes: ['vehicleId'], raw: true });
		return new Set(rows.map((r) => Number(r.vehicleId)));
	});
	return watched.has(vehicleId);
}

export type WatchlistItem = {
	vehicle: { id: number; slug: string; title: string };
	watchedSince: string;
	latest: { revisionId: number; parentId: number | null; at: string; by: string; summary: string | null } | null;
	newerAwaitingReview: boolean;
};

/** Watched pages, most recently changed first, each with the latest change this person may see. */
export async function watchlist(user: SessionUser): Promise<WatchlistItem[]> {
	const watches = await Watch.findAll({ where: { userId: user.id }, order: [['createdAt', 'DESC']], limit: 1000 });
	const items: WatchlistItem[] = [];
	for (const w of watches) {
		const vehicle = await vehicleById(w.vehicleId);
		if (!vehicle) continue;
		const { revision, newerAwaitingReview } = await pageRevision(vehicle, user);
		items.push({
			vehicle: { id: vehicle.id, slug: vehicle.slug, title: vehicle.title },
			watchedSince: w.createdAt.toISOString(),
			latest: revision
				? {
						revisionId: revision.id,
						parentId: revision.parentId,
						at: revision.createdAt.toISOString(),
						by: revision.authorName,
						summary: revision.hidden ? null : revision.summary
					}
				: null,
			newerAwaitingReview
		});
	}
	return items.sort((a, b) => (b.latest?.at ?? '').localeCompare(a.latest?.at ?? ''));
}

const NOTIFYING_KINDS: RevisionWritten['kind'][] = ['create', 'save', 'restore', 'review'];

/**
 * After a committed change: the author starts watching (unless they turned that off), and every other active
 * watcher who may read the change gets a notice queued, to go out at once or in their daily digest. A watcher
 * who may not read it yet (a viewer, while sign-off is required) is told when a moderator signs it off.
 */
export async function queueNotices(event: RevisionWritten): Promise<number> {
	if (!NOTIFYING_KINDS.includes(event.kind)) return 0;
	const revision = await revisionById(event.revisionId);
	if (!revision) return 0;
	const rules = await readingRules();
	const signOff = event.kind === 'review';
	if (signOff && !rules.signOffRequired) return 0;
	const authorPrefs = await noticePreferences(event.authorId);
	if (!signOff && authorPrefs.watchOwnEdits) {
		await Watch.bulkCreate([{ userId: event.authorId, vehicleId: event.vehicleId }], { ignoreDuplicates: true });
		watchedBy.delete(event.authorId);
	}
	const watchers = await Watch.findAll({
		where: { vehicleId: event.vehicleId, userId: { [Op.ne]: revision.authorId } },
		include: [
			{
				model: User,
				as: 'user',
				where: { status: 'active' },
				attributes: ['id', 'role'],
				include: [{ model: NotificationPreference, as: 'noticePreference', required: false }]
			}
		]
	});
	// On a sign-off, only those who could not read the change before hear of it now.
	const readers = watchers.filter((w) => {
		const user = (w as Watch & { user: User }).user;
		return mayReadRevision(revision, user, rules) && !(signOff && readsUnsignedOff(user, rules));
	});
	if (!readers.length) return 0;
	const rows = readers.map((w) => {
		const prefs = (w as Watch & { user: User & { noticePreference?: NotificationPreference | null } }).user.noticePreference;
		return { userId: w.userId, vehicleId: event.vehicleId, revisionId: event.revisionId, mode: prefs?.noticeMode ?? DEFAULT_PREFERENCES.noticeMode };
	});
	await PendingNotice.bulkCreate(rows, { ignoreDuplicates: true });
	if (rows.some((r) => r.mode === 'immediate')) kickDelivery();
	return rows.length;
}

function links(vehicle: VehicleSummary, revisionId: number, parentId: number | null) {
	const pageLink = `${config.origin}/vehicles/${vehicle.slug}`;
	return { pageLink, compareLink: parentId ? `${pageLink}/compare?from=${parentId}&to=${revisionId}` : null };
}

/** A notice tells of a change only a person who may read it now; others' notices are dropped when due. */
async function changeLine(notice: PendingNotice, recipient: Pick<User, 'role'>): Promise<ChangeLine | null> {
	const [revision, vehicle, shop] = await Promise.all([revisionById(Number(notice.revisionId)), vehicleById(notice.vehicleId), shopSettings()]);
	if (!revision || !vehicle || !(await mayRead(revision, recipient))) return null;
	return {
		vehicleTitle: vehicle.title,
		...links(vehicle, revision.id, revision.parentId),
		editorName: revision.authorName,
		summary: revision.hidden ? null : revision.summary,
		when: revision.createdAt,
		isNewPage: revision.parentId === null,
		timeZone: shop.timeZone
	};
}

/**
 * Claims notices inside the caller's transaction (the rows stay locked until it ends), so two app servers never
 * mail the same notice, and a claimed notice always has its mail queued with it.
 */
async function claim(ids: number[], now: Date, transaction: Transaction): Promise<number[]> {
	const claimed: number[] = [];
	for (const id of ids) {
		const [n] = await PendingNotice.update({ sentAt: now }, { where: { id, sentAt: null }, transaction });
		if (n) claimed.push(id);
	}
	return claimed;
}

const footerLinks = () => ({ accountLink: `${config.origin}/account`, followingLink: `${config.origin}/following` });

/** Sends queued messages now; what the mail server does not take stays in the mail queue for its retries. */
async function sendNow(mailIds: (number | null)[]): Promise<number> {
	const ids = mailIds.filter((id): id is number => id !== null);
	return ids.length ? (await deliverQueuedMail({ ids })).sent.length : 0;
}

/** Hands every "at once" notice to the mail queue and sends it; a mail server that is down only delays it. */
export async function deliverImmediateNotices(now = new Date()): Promise<number> {
	const due = await PendingNotice.findAll({ where: { mode: 'immediate', sentAt: null }, order: [['id', 'ASC']], limit: 500 });
	const mailIds: (number | null)[] = [];
	for (const notice of due) {
		const user = await User.findByPk(notice.userId, { attributes: ['id', 'email', 'name', 'status', 'role'] });
		const line = user ? await changeLine(notice, user) : null;
		mailIds.push(
			await db().transaction(async (transaction) => {
				const [id] = await claim([Number(notice.id)], now, transaction);
				if (!id || !user || user.status !== 'active' || !line) return null;
				return queueMail({ to: user.email, ...changeNoticeMail({ recipientName: user.name, change: line, ...footerLinks() }) }, transaction);
			})
		);
	}
	return sendNow(mailIds);
}

/**
 * Sends each digest reader one mail with everything queued for them, at most once a day: due a day after their
 * last digest, or for a first digest a day after the oldest change in it.
 */
export async function sendDigests(now = new Date()): Promise<number> {
	const queued = await PendingNotice.findAll({
		where: { mode: 'digest', sentAt: null, createdAt: { [Op.lte]: now } },
		attributes: ['userId', 'createdAt']
	});
	const oldestByUser = new Map<number, Date>();
	for (const n of queued) {
		const seen = oldestByUser.get(n.userId);
		if (!seen || n.createdAt < seen) oldestByUser.set(n.userId, n.createdAt);
	}
	const mailIds: (number | null)[] = [];
	for (const [userId, oldest] of oldestByUser) {
		const prefs = await NotificationPreference.findByPk(userId);
		const since = prefs?.lastDigestAt ?? oldest;
		if (now.getTime() - since.getTime() < DIGEST_INTERVAL_MS - DIGEST_SLACK_MS) continue;
		const user = await User.findByPk(userId, { attributes: ['id', 'email', 'name', 'status', 'role'] });
		if (!user || user.status !== 'active') continue;
		mailIds.push(
			await db().transaction(async (transaction) => {
				const notices = await PendingNotice.findAll({ where: { userId, mode: 'digest', sentAt: null, createdAt: { [Op.lte]: now } }, order: [['revisionId', 'ASC']], transaction });
				const ids = await claim(notices.map((n) => Number(n.id)), now, transaction);
				const lines = (await Promise.all(notices.filter((n) => ids.includes(Number(n.id))).map((n) => changeLine(n, user)))).filter((l): l is ChangeLine => l !== null);
				if (!lines.length) return null;
				if (prefs) await prefs.update({ lastDigestAt: now }, { transaction });
				else await NotificationPreference.create({ userId, noticeMode: 'digest', lastDigestAt: now }, { transaction });
				return queueMail({ to: user.email, ...digestMail({ recipientName: user.name, changes: lines, ...footerLinks() }) }, transaction);
			})
		);
	}
	return sendNow(mailIds);
}

// Immediate notices go out behind the save, one run at a time, so a slow mail server never delays an edit.
let delivering: Promise<void> = Promise.resolve();

function kickDelivery(): void {
	delivering = delivering
		.then(() => deliverImmediateNotices())
		.then(
			() => undefined,
			(err) => logFailure('watch notices failed', err)
		);
}

/** Resolves once notices queued so far have been handed to the mail server. */
export function noticesSettled(): Promise<void> {
	return delivering;
}

let running: (() => void) | null = null;

/** Listens for committed changes and checks hourly for digests (and notices whose mail failed). */
export function startWatchNotices(): () => void {
	if (running) return running;
	const unsubscribe = onRevisionWritten((event) => queueNotices(event).then(() => undefined));
	const timer = setInterval(() => {
		kickDelivery();
		sendDigests(new Date()).catch((err) => logFailure('digests failed', err));
	}, HOUR_MS);
	timer.unref();
	running = () => {
		clearInterval(timer);
		unsubscribe();
		running = null;
	};
	return running;
}
