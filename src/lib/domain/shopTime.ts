// Every date and time a person reads is in the shop's own time zone (a shop setting), with the zone's short
// name beside it, so "14:05 CEST" on a screen, a mail and a printed sheet mean the same moment.

export const DEFAULT_TIME_ZONE = 'UTC';

/** IANA zones this runtime knows; "UTC" is accepted by name even where the list leaves it out. */
export function knownTimeZones(): string[] {
	const zones = Intl.supportedValuesOf('timeZone');
	return zones.includes('UTC') ? zones : ['UTC', ...zones];
}

/** A zone to format with: an unknown or missing one reads as UTC rather than failing a page. */
export function usableZone(zone: string | null | undefined): string {
	if (!zone) return DEFAULT_TIME_ZONE;
	let usable = checkedZones.get(zone);
	if (usable === undefined) {
		try {
			new Intl.DateTimeFormat('en', { timeZone: zone });
			usable = zone;
		} catch {
			usable = DEFAULT_TIME_ZONE;
		}
		// Building a formatter is the costly part of every date on a page; a zone is checked once.
		if (checkedZones.size < 1000) checkedZones.set(zone, usable);
	}
	return usable;
}
const checkedZones = new Map<string, string>();

// English locales whose short names are letters ("CEST", "EDT", "AEST", "IST", "NZST"); else "GMT+5:45".
const NAME_LOCALES = ['en-US', 'en-GB', 'en-AU', 'en-NZ', 'en-IN', 'en-CA'];
const formatters = new Map<string, Intl.DateTimeFormat>();
function formatter(locale: string, zone: string, options: Intl.DateTimeFormatOptions): Intl.DateTimeFormat {
	const key = `${locale}|${zone}|${JSON.stringify(options)}`;
	let f = formatters.get(key);
	if (!f) formatters.set(key, (f = new Intl.DateTimeFormat(locale, { ...options, timeZone: zone })));
	return f;
}

/** The zone's short name at that moment: summer and winter names differ. */
export function zoneShortName(at: Date, zone: string): string {
	let fallback = '';
	for (const locale of NAME_LOCALES) {
		const name = formatter(locale, zone, { timeZoneName: 'short' }).formatToParts(at).find((p) => p.type === 'timeZoneName')?.value ?? '';
		if (/^[A-Z]{2,5}$/.test(name)) return name;
		fallback ||= name;
	}
	return fallback || zone;
}

const asDate = (at: string | Date) => (typeof at === 'string' ? new Date(at) : at);

function parts(at: Date, zone: string): Record<string, string> {
	const out: Record<string, string> = {};
	for (const p of formatter('en-CA', zone, { year: 'numeric', month: '2-digit', day: '2-digit', hour: '2-digit', minute: '2-digit', hourCycle: 'h23' }).formatToParts(at)) {
		out[p.type] = p.value;
	}
	return out;
}

// Formatting a date is the costly part of every date on a page (tens of microseconds each), and a list shows
// many dates close together. What a formatter shows changes only at whole quarter hours of UTC: every zone's
// offset from 1980 on is a whole number of quarter hours, and its clocks change at a whole minute of local time.
// So the text is kept per zone and quarter hour for a day, per zone and minute for a day and time.
const QUARTER_HOUR_MS = 15 * 60 * 1000;
const MINUTE_MS = 60 * 1000;
/** Before this no kept text is used: older offsets may be odd minutes and seconds (local mean time). */
const KEPT_FROM_MS = Date.UTC(1980, 0, 1);
const KEPT_TEXTS = 2000;

function keptText(kept: Map<string, string>, zone: string, at: Date, stepMs: number, format: () => string): string {
	const t = at.getTime();
	if (t < KEPT_FROM_MS) return format();
	const key = `${zone}|${Math.floor(t / stepMs)}`;
	let text = kept.get(key);
	if (text === undefined) {
		if (kept.size >= KEPT_TEXTS) kept.clear();
		kept.set(key, (text = format()));
	}
	return text;
}
const keptTimes = new Map<string, string>();
const keptDays = new Map<string, string>();

/** "2026-07-01 14:00 CEST": the date and time in the shop's zone, with its short name. */
export function formatWhen(at: string | Date, zone: string = DEFAULT_TIME_ZONE): string {
	const d = asDate(at);
	if (Number.isNaN(d.getTime())) return '';
	const z = usableZone(zone);
	return keptText(keptTimes, z, d, MINUTE_MS, () => {
		const p = parts(d, z);
		return `${p.year}-${p.month}-${p.day} ${p.hour}:${p.minute} ${zoneShortName(d, z)}`;
	});
}

const DAY_OPTIONS: Intl.DateTimeFormatOptions = { day: 'numeric', month: 'short', year: 'numeric' };

/** "1 Jul 2026": the day in the shop's zone, for lines that need no time. */
export function formatDay(at: string | Date, zone: string = DEFAULT_TIME_ZONE): string {
	const d = asDate(at);
	if (Number.isNaN(d.getTime())) return '';
	const z = usableZone(zone);
	return keptText(keptDays, z, d, QUARTER_HOUR_MS, () => formatter('en-GB', z, DAY_OPTIONS).format(d));
}

/** The moment a calendar day ("2026-07-01") starts in the zone: 00:00 there, as an instant. */
export function startOfDay(day: string, zone: string = DEFAULT_TIME_ZONE): Date {
	const [y, m, d] = day.split('-').map(Number);
	const z = usableZone(zone);
	const wall = Date.UTC(y, m - 1, d);
	let at = wall;
	// Move by the zone's offset until 00:00 local is reached (twice covers an offset that changes that night).
	for (let i = 0; i < 3; i++) {
		const p = parts(new Date(at), z);
		at += wall - Date.UTC(Number(p.year), Number(p.month) - 1, Number(p.day), Number(p.hour), Number(p.minute));
	}
	return new Date(at);
}

/** The calendar day after `day`, both as YYYY-MM-DD. */
export function nextDay(day: string): string {
	const [y, m, d] = day.split('-').map(Number);
	return new Date(Date.UTC(y, m - 1, d + 1)).toISOString().slice(0, 10);
}
