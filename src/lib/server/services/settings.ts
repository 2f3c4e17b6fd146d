import { Setting } from '../db/models';
import { DEFAULT_TIME_ZONE, usableZone } from '../../domain/shopTime';
import { timeZoneSchema } from '../../domain/timeZoneInput';
import { roleAtLeast } from '../../domain/roles';
import type { SessionUser } from '../../domain/sessionUser';
import { db } from '../db';
import { ServiceError } from '../errors';
import { recordAudit } from './audit';
import { SHARED_STATE_TTL_MS } from '../cache';

/** `reviewBeforeShowSince`: changes saved before review was switched on stay visible without a review. */
export type ShopSettings = {
	shopName: string;
	sampleData: boolean;
	reviewBeforeShow: boolean;
	reviewBeforeShowSince: string | null;
	/** IANA zone every date and time is shown in. */
	timeZone: string;
};

const DEFAULTS: ShopSettings = { shopName: 'Kickpanel', sampleData: false, reviewBeforeShow: false, reviewBeforeShowSince: null, timeZone: DEFAULT_TIME_ZONE };
let cached: { at: number; value: ShopSettings } | null = null;

/** Another server's change (sign-off switched on, a new time zone) shows here within SHARED_STATE_TTL_MS; `fresh` reads it now. */
export async function shopSettings(opts: { fresh?: boolean } = {}): Promise<ShopSettings> {
	if (!opts.fresh && cached && Date.now() - cached.at < SHARED_STATE_TTL_MS) return cached.value;
	const rows = await Setting.findAll();
	const value = { ...DEFAULTS };
	for (const row of rows) {
		if (row.name === 'shopName') value.shopName = row.value;
		if (row.name === 'sampleData') value.sampleData = row.value === 'true';
		if (row.name === 'reviewBeforeShow') value.reviewBeforeShow = row.value === 'true';
		if (row.name === 'reviewBeforeShowSince') value.reviewBeforeShowSince = row.value || null;
		if (row.name === 'timeZone') value.timeZone = usableZone(row.value);
	}
	cached = { at: Date.now(), value };
	return value;
}

export async function saveSetting(name: keyof ShopSettings, value: string | boolean): Promise<void> {
	await Setting.upsert({ name, value: String(value) });
	cached = null;
}

/** After settings were written in a caller's own transaction. */
export function forgetShopSettings(): void {
	cached = null;
}

/** The shop's time zone: an IANA name this server knows (a ZodError names the problem), written with its audit entry. */
export async function setShopTimeZone(zone: unknown, actor: SessionUser): Promise<string> {
	if (!roleAtLeast(actor.role, 'admin')) throw new ServiceError('Changing shop settings needs the admin role.', 403);
	const next = timeZoneSchema.parse(zone);
	const current = await shopSettings();
	if (current.timeZone === next) return next;
	await db().transaction(async (transaction) => {
		await Setting.upsert({ name: 'timeZone', value: next }, { transaction });
		await recordAudit({ actorId: actor.id, action: 'setting.change', targetType: 'setting', targetId: 'timeZone', details: { from: current.timeZone, to: next } }, transaction);
	});
	forgetShopSettings();
	return next;
}
