// What the seat-space index reads from MariaDB: the seat spaces, dash and speaker locations of the revision
// of each page that every signed-in person may read (readingRules.ts).
import { Op, QueryTypes } from 'sequelize';
import { db } from '../db';
import { Vehicle } from '../db/models';
import type { BootSpace, LoadOpening } from '../../domain/bootFit';
import { SEATS, type BootSection, type DashSection, type Seat, type SeatSpace, type SpeakerLocation } from '../../domain/content/schema';
import { vehicleTitle } from '../../domain/slug';
import type { ReadingRules } from '../../domain/visibility';
import { INDEX_READER, pageRevisionSql } from '../services/readingRules';

/** One page's places as the reverse fit query needs them. */
export type VehicleFacts = {
	vehicleId: number;
	slug: string;
	title: string;
	revisionId: number;
	seats: { id: string; seat: Seat; l: number | null; w: number | null; h: number | null }[];
	dash: { opening: DashSection['opening']; depthMm: number | null; openingWidthMm: number | null; openingHeightMm: number | null };
	speakers: { id: string; location: string; cutoutMm: number | null; depthMm: number | null }[];
	boot: { space: BootSpace; opening: LoadOpening };
};

export type SeatFact = VehicleFacts['seats'][number];

type FactRow = {
	vehicleId: number;
	slug: string;
	yearFrom: number;
	yearTo: number;
	make: string;
	model: string;
	revisionId: number | string;
	seats: unknown;
	dash: unknown;
	speakers: unknown;
	boot: unknown;
};

const factsSql = (rules: ReadingRules) => `SELECT v.id AS vehicleId, v.slug, v.year_from AS yearFrom, v.year_to AS yearTo, mk.name AS make, md.name AS model,
	r.id AS revisionId,
	JSON_EXTRACT(r.content, '$.seats.spaces') AS seats,
	JSON_EXTRACT(r.content, '$.dash') AS dash,
	JSON_EXTRACT(r.content, '$.speakers.locations') AS speakers,
	JSON_EXTRACT(r.content, '$.boot') AS boot
FROM vehicles v
JOIN makes mk ON mk.id = v.make_id
JOIN models md ON md.id = v.model_id
JOIN revisions r ON r.id = ${pageRevisionSql('v', INDEX_READER, rules)}`;

const json = <T>(v: unknown, fallback: T): T => {
	if (v === null || v === undefined) return fallback;
	if (typeof v === 'string') {
		try {
			return (JSON.parse(v) as T) ?? fallback;
		} catch {
			return fallback;
		}
	}
	return v as T;
};

const mmOrNull = (v: unknown): number | null => (typeof v === 'number' && v > 0 && Number.isFinite(v) ? v : null);

function toFacts(row: FactRow): VehicleFacts {
	const seats = json<Partial<SeatSpace>[]>(row.seats, []);
	const dash = json<Partial<DashSection>>(row.dash, {});
	const speakers = json<Partial<SpeakerLocation>[]>(row.speakers, []);
	const boot = json<Partial<BootSection>>(row.boot, {});
	return {
		vehicleId: Number(row.vehicleId),
		slug: row.slug,
		title: vehicleTitle({ make: row.make, model: row.model, yearFrom: row.yearFrom, yearTo: row.yearTo }),
		revisionId: Number(row.revisionId),
		seats: seats
			.filter((s) => typeof s.id === 'string' && (SEATS as readonly string[]).includes(s.seat as string))
			.map((s) => ({ id: s.id!, seat: s.seat!, l: mmOrNull(s.lengthMm), w: mmOrNull(s.widthMm), h: mmOrNull(s.heightMm) })),
		dash: { opening: dash.opening ?? null, depthMm: mmOrNull(dash.depthMm), openingWidthMm: mmOrNull(dash.openingWidthMm), openingHeightMm: mmOrNull(dash.openingHeightMm) },
		speakers: speakers
			.filter((s) => typeof s.id === 'string')
			.map((s) => ({ id: s.id!, location: s.location || 'Unnamed location', cutoutMm: mmOrNull(s.cutoutMm), depthMm: mmOrNull(s.depthMm) })),
		boot: {
			space: { l: mmOrNull(boot.floorLengthMm), lTop: mmOrNull(boot.depthTopMm), w: mmOrNull(boot.floorWidthMm), archW: mmOrNull(boot.archWidthMm), h: mmOrNull(boot.heightMm) },
			opening: { w: mmOrNull(boot.openingWidthMm), h: mmOrNull(boot.openingHeightMm) }
		}
	};
}

/** Pages after `afterId` in id order, a batch at a time. */
export async function factsAfter(afterId: number, batch: number, rules: ReadingRules): Promise<VehicleFacts[]> {
	const rows = await db().query<FactRow>(`${factsSql(rules)} WHERE v.id > :after ORDER BY v.id LIMIT :batch`, {
		replacements: { after: afterId, batch },
		type: QueryTypes.SELECT
	});
	return rows.map(toFacts);
}

export async function factsOf(vehicleId: number, rules: ReadingRules): Promise<VehicleFacts | null> {
	const rows = await db().query<FactRow>(`${factsSql(rules)} WHERE v.id = :id`, { replacements: { id: vehicleId }, type: QueryTypes.SELECT });
	return rows[0] ? toFacts(rows[0]) : null;
}

/** Pages touched since `since`: what another instance may have saved, hidden or signed off. */
export async function pagesTouchedSince(since: Date): Promise<{ vehicleId: number; revisionId: number | null }[]> {
	const changed = await Vehicle.findAll({ where: { updatedAt: { [Op.gte]: since } }, attributes: ['id', 'latestRevisionId'] });
	return changed.map((v) => ({ vehicleId: v.id, revisionId: v.latestRevisionId === null ? null : Number(v.latestRevisionId) }));
}
