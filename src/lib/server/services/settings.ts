import { Setting } from '../db/models';

/** `reviewBeforeShowSince`: changes saved before review was switched on stay visible without a review. */
export type ShopSettings = { shopName: string; sampleData: boolean; reviewBeforeShow: boolean; reviewBeforeShowSince: string | null };

const DEFAULTS: ShopSettings = { shopName: 'Kickpanel', sampleData: false, reviewBeforeShow: false, reviewBeforeShowSince: null };
let cached: { at: number; value: ShopSettings } | null = null;
const TTL_MS = 5_000;

export async function shopSettings(): Promise<ShopSettings> {
	if (cached && Date.now() - cached.at < TTL_MS) return cached.value;
	const rows = await Setting.findAll();
	const value = { ...DEFAULTS };
	for (const row of rows) {
		if (row.name === 'shopName') value.shopName = row.value;
		if (row.name === 'sampleData') value.sampleData = row.value === 'true';
		if (row.name === 'reviewBeforeShow') value.reviewBeforeShow = row.value === 'true';
		if (row.name === 'reviewBeforeShowSince') value.reviewBeforeShowSince = row.value || null;
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
