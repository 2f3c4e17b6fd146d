import { Setting } from '../db/models';

export type ShopSettings = { shopName: string; sampleData: boolean };

const DEFAULTS: ShopSettings = { shopName: 'Kickpanel', sampleData: false };
let cached: { at: number; value: ShopSettings } | null = null;
const TTL_MS = 5_000;

export async function shopSettings(): Promise<ShopSettings> {
	if (cached && Date.now() - cached.at < TTL_MS) return cached.value;
	const rows = await Setting.findAll();
	const value = { ...DEFAULTS };
	for (const row of rows) {
		if (row.name === 'shopName') value.shopName = row.value;
		if (row.name === 'sampleData') value.sampleData = row.value === 'true';
	}
	cached = { at: Date.now(), value };
	return value;
}

export async function saveSetting(name: keyof ShopSettings, value: string | boolean): Promise<void> {
	await Setting.upsert({ name, value: String(value) });
	cached = null;
}
