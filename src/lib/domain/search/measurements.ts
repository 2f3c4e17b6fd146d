import type { VehicleContent } from '../content/schema';
import { SEAT_NAMES, SEATS, type Seat, type SectionKey } from '../content/vocabulary';

// Measurements search can filter on. A page may record several entries of one place (two passenger
// spaces, three passages); conditions on the same place must all hold on one and the same entry.

type Dimension = 'lengthMm' | 'widthMm' | 'heightMm';
const DIMENSIONS: { key: Dimension; word: string; label: string }[] = [
	{ key: 'lengthMm', word: 'length', label: 'length' },
	{ key: 'widthMm', word: 'width', label: 'width' },
	{ key: 'heightMm', word: 'height', label: 'clearance height' }
];

// The boot's figures search may filter on, all on its one space.
const BOOT_FIGURES = [
	{ key: 'floorLengthMm', word: 'length', label: 'Boot floor length' },
	{ key: 'floorWidthMm', word: 'width', label: 'Boot floor width' },
	{ key: 'heightMm', word: 'height', label: 'Boot height to the shelf or cover' },
	{ key: 'archWidthMm', word: 'arch-width', label: 'Boot width between the wheel arches' },
	{ key: 'openingWidthMm', word: 'opening-width', label: 'Boot load opening width' },
	{ key: 'openingHeightMm', word: 'opening-height', label: 'Boot load opening height' }
] as const;

/** A kind of place measured on a page: each recorded entry's figures, one per measurement of the place. */
export type MeasurePlace = { key: string; entries(content: VehicleContent): (number | null)[][] };

export type MeasurementDefinition = {
	key: string;
	label: string;
	section: SectionKey;
	/** Index of its place in MEASURE_PLACES, and of its figure in each entry. */
	place: number;
	column: number;
};

const seatPlace = (seat: Seat): MeasurePlace => ({
	key: `${seat}-seat`,
	entries: (c) => c.seats.spaces.filter((s) => s.seat === seat).map((s) => DIMENSIONS.map((d) => s[d.key]))
});

export const MEASURE_PLACES: readonly MeasurePlace[] = [
	...SEATS.map(seatPlace),
	{ key: 'dash', entries: (c) => [[c.dash.depthMm]] },
	{ key: 'firewall', entries: (c) => c.firewall.passages.map((p) => [p.holeMm]) },
	{
		key: 'boot',
		entries: (c) => [BOOT_FIGURES.map((f) => c.boot[f.key])]
	}
];

export const MEASUREMENTS: readonly MeasurementDefinition[] = [
	...SEATS.flatMap((seat, place) =>
		DIMENSIONS.map((dim, column) => ({ key: `${seat}-seat-${dim.word}`, label: `${SEAT_NAMES[seat]} seat space ${dim.label}`, section: 'seats' as const, place, column }))
	),
	{ key: 'dash-depth', label: 'Dash usable chassis depth', section: 'dash', place: SEATS.length, column: 0 },
	{ key: 'firewall-hole', label: 'Firewall pass-through hole size', section: 'firewall', place: SEATS.length + 1, column: 0 },
	...BOOT_FIGURES.map((f, column) => ({ key: `boot-${f.word}`, label: f.label, section: 'boot' as const, place: SEATS.length + 2, column }))
];

export const MEASUREMENT_KEYS = MEASUREMENTS.map((m) => m.key);
export const measurementByKey = new Map(MEASUREMENTS.map((m, i) => [m.key, { ...m, index: i }]));

/**
 * Figures are compared in whole micrometres, the precision a page stores them at (3.5 in is kept as
 * 88.9 mm, not 88.89999999999999): a value typed in mm or inches matches its own recording exactly.
 */
export const toMicrometres = (mm: number): number => Math.round(mm * 1000);

export type ComparisonOp = 'gte' | 'lte';
export const COMPARISON_NAMES: Readonly<Record<ComparisonOp, string>> = { gte: 'at least', lte: 'at most' };

export type MeasureCondition = { measure: string; op: ComparisonOp; mm: number };

export function describeCondition(cond: MeasureCondition): string {
	const m = measurementByKey.get(cond.measure);
	return `${m?.label ?? cond.measure} ${COMPARISON_NAMES[cond.op]} ${cond.mm} mm`;
}
