import { describe, expect, it } from 'vitest';
import { formatDay, formatWhen, knownTimeZones, nextDay, startOfDay, usableZone, zoneShortName } from '../../src/lib/domain/shopTime';
import { timeZoneSchema } from '../../src/lib/domain/timeZoneInput';

// Offsets below follow the tz database's rules as published: the EU's summer time runs from the last
// Sunday of March to the last Sunday of October at 01:00 UTC (Directive 2000/84/EC); the US's from the
// second Sunday of March to the first Sunday of November at 02:00 local (Energy Policy Act of 2005);
// India keeps UTC+5:30 all year (IST); Nepal UTC+5:45. Each expected time is UTC plus that offset, by hand.
describe('dates and times in the shop’s zone', () => {
	it('UTC stays as stored', () => {
		expect(formatWhen('2026-07-01T12:00:00.000Z', 'UTC')).toBe('2026-07-01 12:00 UTC');
		expect(formatWhen(new Date('2026-01-31T23:59:00Z'))).toBe('2026-01-31 23:59 UTC');
	});

	it('Berlin is UTC+2 in summer (CEST) and UTC+1 in winter (CET)', () => {
		expect(formatWhen('2026-07-01T12:00:00Z', 'Europe/Berlin')).toBe('2026-07-01 14:00 CEST');
		expect(formatWhen('2026-12-05T06:30:00Z', 'Europe/Berlin')).toBe('2026-12-05 07:30 CET');
		// Summer time starts 29 March 2026 at 01:00 UTC (last Sunday of March): 00:59 UTC is still 01:59 CET.
		expect(formatWhen('2026-03-29T00:59:00Z', 'Europe/Berlin')).toBe('2026-03-29 01:59 CET');
		expect(formatWhen('2026-03-29T01:00:00Z', 'Europe/Berlin')).toBe('2026-03-29 03:00 CEST');
	});

	it('New York is UTC−4 in summer (EDT) and UTC−5 in winter (EST), so the day can be the one before', () => {
		expect(formatWhen('2026-07-01T02:15:00Z', 'America/New_York')).toBe('2026-06-30 22:15 EDT');
		expect(formatWhen('2026-12-05T03:00:00Z', 'America/New_York')).toBe('2026-12-04 22:00 EST');
		expect(formatDay('2026-12-05T03:00:00Z', 'America/New_York')).toBe('4 Dec 2026');
	});

	it('zones with half and quarter hours', () => {
		expect(formatWhen('2026-07-01T12:00:00Z', 'Asia/Kolkata')).toBe('2026-07-01 17:30 IST');
		// Nepal has no letter abbreviation in English: the offset stands in for it.
		expect(formatWhen('2026-07-01T12:00:00Z', 'Asia/Kathmandu')).toBe('2026-07-01 17:45 GMT+5:45');
	});

	it('gives the same text again for the same minute or quarter hour, and the next text past its edge', () => {
		// Nepal Standard Time is UTC+5:45 (from memory): its midnight is 18:15 UTC
		expect(formatDay('2026-02-28T18:14:59Z', 'Asia/Kathmandu')).toBe('28 Feb 2026');
		expect(formatDay('2026-02-28T18:00:00Z', 'Asia/Kathmandu')).toBe('28 Feb 2026');
		expect(formatDay('2026-02-28T18:15:00Z', 'Asia/Kathmandu')).toBe('1 Mar 2026');
		expect(formatDay('2026-02-28T18:29:59Z', 'Asia/Kathmandu')).toBe('1 Mar 2026');
		// The same moments in another zone are not taken from Nepal's (UTC: still 28 February)
		expect(formatDay('2026-02-28T18:15:00Z', 'UTC')).toBe('28 Feb 2026');
		// Berlin's summer time starts 29 March 2026 at 01:00 UTC (Directive 2000/84/EC)
		expect(formatWhen('2026-03-29T00:59:00Z', 'Europe/Berlin')).toBe('2026-03-29 01:59 CET');
		expect(formatWhen('2026-03-29T00:59:59Z', 'Europe/Berlin')).toBe('2026-03-29 01:59 CET');
		expect(formatWhen('2026-03-29T01:00:30Z', 'Europe/Berlin')).toBe('2026-03-29 03:00 CEST');
		// Long before the kept range, dates are formatted every time all the same
		expect(formatDay('1970-01-01T00:00:00Z', 'UTC')).toBe('1 Jan 1970');
	});

	it('midnight is 00, never 24', () => {
		expect(formatWhen('2026-07-01T22:00:00Z', 'Europe/Berlin')).toBe('2026-07-02 00:00 CEST');
	});

	it('an unknown zone reads as UTC instead of failing a page', () => {
		expect(usableZone('Mars/Olympus')).toBe('UTC');
		expect(usableZone(undefined)).toBe('UTC');
		expect(formatWhen('2026-07-01T12:00:00Z', 'Mars/Olympus')).toBe('2026-07-01 12:00 UTC');
		expect(formatWhen('not a date', 'UTC')).toBe('');
	});

	it('names the zone as it is at that moment', () => {
		expect(zoneShortName(new Date('2026-01-15T12:00:00Z'), 'Australia/Sydney')).toBe('AEDT');
		expect(zoneShortName(new Date('2026-07-15T12:00:00Z'), 'Australia/Sydney')).toBe('AEST');
	});
});

describe('where a day starts in the shop’s zone', () => {
	it('starts a summer day in Berlin at 22:00 UTC the evening before', () => {
		// Directive 2000/84/EC: summer time (CEST, UTC+2) runs from the last Sunday of March to the last Sunday of October
		expect(startOfDay('2026-07-01', 'Europe/Berlin').toISOString()).toBe('2026-06-30T22:00:00.000Z');
		// Winter (CET, UTC+1)
		expect(startOfDay('2026-01-15', 'Europe/Berlin').toISOString()).toBe('2026-01-14T23:00:00.000Z');
	});

	it('starts a winter day in New York at 05:00 UTC, and Kathmandu’s at 18:15 UTC the day before', () => {
		// Energy Policy Act of 2005: standard time (EST, UTC−5) from the first Sunday of November to the second Sunday of March
		expect(startOfDay('2026-01-15', 'America/New_York').toISOString()).toBe('2026-01-15T05:00:00.000Z');
		// Nepal Standard Time is UTC+5:45 all year (from memory)
		expect(startOfDay('2026-03-01', 'Asia/Kathmandu').toISOString()).toBe('2026-02-28T18:15:00.000Z');
	});

	it('finds the start of the day on which the clocks change', () => {
		// 2026-03-29 is the last Sunday of March: Berlin is still on CET (UTC+1) at midnight
		expect(startOfDay('2026-03-29', 'Europe/Berlin').toISOString()).toBe('2026-03-28T23:00:00.000Z');
		expect(nextDay('2026-02-28')).toBe('2026-03-01');
		expect(nextDay('2028-02-28')).toBe('2028-02-29');
	});
});

describe('the time-zone setting', () => {
	it('accepts IANA names the runtime lists, and UTC', () => {
		expect(timeZoneSchema.parse('Europe/Berlin')).toBe('Europe/Berlin');
		expect(timeZoneSchema.parse(' UTC ')).toBe('UTC');
		expect(knownTimeZones()).toContain('America/Chicago');
	});

	it('refuses anything else with a message a person can act on', () => {
		const bad = timeZoneSchema.safeParse('CEST');
		expect(bad.success).toBe(false);
		expect(bad.error?.issues[0].message).toMatch(/pick one from the list/);
		expect(timeZoneSchema.safeParse('').error?.issues[0].message).toMatch(/Pick the shop/);
		expect(timeZoneSchema.safeParse(42).success).toBe(false);
	});
});
