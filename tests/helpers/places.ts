import type { SeatSpace } from '../../src/lib/domain/content/schema';

/** A seat space as a page records it, null where not measured (figures in mm). */
export const seatSpace = (id: string, seat: SeatSpace['seat'], l: number | null, w: number | null, h: number | null): SeatSpace => ({
	id,
	seat,
	lengthMm: l,
	widthMm: w,
	heightMm: h,
	obstacles: '',
	boardNeeded: false,
	travelNotes: ''
});
