import { SEAT_NAMES, SEATS, type Seat, type SectionKey, type VehicleContent } from '../content/schema';

// Measurements search can filter on. A page may record several entries for one (two passenger
// spaces, three passages); a condition holds when any one of them meets it.

type Dimension = 'lengthMm' | 'widthMm' | 'heightMm';
const DIMENSIONS: { key: Dimension; word: string; label: string }[] = [
	{ key: 'lengthMm', word: 'length', label: 'length' },
	{ key: 'widthMm', word: 'width', label: 'width' },
	{ key: 'heightMm', word: 'height', label: 'clearance height' }
];

export type MeasurementDefinition = {
	key: string;
	label: string;
	section: SectionKey;
	values(content: VehicleContent): number[];
};

const seatMeasure = (seat: Seat, dim: (typeof DIMENSIONS)[number]): MeasurementDefinition => ({
	key: `${seat}-seat-${dim.word}`,
	label: `${SEAT_NAMES[seat]} seat space ${dim.label}`,
	section: 'seats',
	values: (c) => c.seats.spaces.filter((s) => s.seat === seat).flatMap((s) => (s[dim.key] === null ? [] : [s[dim.key] as number]))
});

export const MEASUREMENTS: readonly MeasurementDefinition[] = [
	...SEATS.flatMap((seat) => DIMENSIONS.map((dim) => seatMeasure(seat, dim))),
	{ key: 'dash-depth', label: 'Dash usable chassis depth', section: 'dash', values: (c) => (c.dash.depthMm === null ? [] : [c.dash.depthMm]) },
	{
		key: 'firewall-hole',
		label: 'Firewall pass-through hole size',
		section: 'firewall',
		values: (c) => c.firewall.passages.flatMap((p) => (p.holeMm === null ? [] : [p.holeMm]))
	}
];

export const MEASUREMENT_KEYS = MEASUREMENTS.map((m) => m.key);
export const measurementByKey = new Map(MEASUREMENTS.map((m, i) => [m.key, { ...m, index: i }]));

export type ComparisonOp = 'gte' | 'lte';
export const COMPARISON_NAMES: Readonly<Record<ComparisonOp, string>> = { gte: 'at least', lte: 'at most' };

export type MeasureCondition = { measure: string; op: ComparisonOp; mm: number };

/** Smallest and largest recorded value of each measurement, NaN where nothing was measured. */
export function measurementRanges(content: VehicleContent): { min: number; max: number }[] {
	return MEASUREMENTS.map((m) => {
		const values = m.values(content);
		return values.length ? { min: Math.min(...values), max: Math.max(...values) } : { min: NaN, max: NaN };
	});
}

/** Whether some recorded entry meets the condition: at least → the largest does, at most → the smallest does. */
export function rangeMeets(range: { min: number; max: number }, cond: Pick<MeasureCondition, 'op' | 'mm'>): boolean {
	return cond.op === 'gte' ? range.max >= cond.mm : range.min <= cond.mm;
}

export function describeCondition(cond: MeasureCondition): string {
	const m = measurementByKey.get(cond.measure);
	return `${m?.label ?? cond.measure} ${COMPARISON_NAMES[cond.op]} ${cond.mm} mm`;
}
