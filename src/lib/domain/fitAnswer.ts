import type { SeatSpace, SpeakerLocation } from './content/schema';
import type { Box, DepthFit } from './fit';
import { dashFit, type DashPlace, pickLocation, pickSpace, seatFitReason, seatSpaceFits, speakerFitReason, speakerLocationFits, type LocationFit, type SpaceFit } from './fitCheck';
import { partBox, partCheck, type Part } from './part';
import { DEFAULT_CLEARANCE_MM } from './sizeRules';
import type { UnitSystem } from './units';

// One answer to "will this part go in this vehicle": worked out from a page's current figures and
// read the same way by the fit screen (in the browser, as the form changes) and the fit endpoint.

/** What a fit check reads from a vehicle page. */
export type FitPlaces = {
	seats: readonly SeatSpace[];
	dash: DashPlace;
	speakers: readonly Pick<SpeakerLocation, 'id' | 'location' | 'cutoutMm' | 'depthMm'>[];
};

export type FitQuestion = {
	/** A catalogue part; without one, `box` is checked against the seat spaces. */
	part: Part | null;
	box?: Box | null;
	clearanceMm?: number;
	/** The seat space (id or seat name) or speaker location id asked for; otherwise the best one. */
	where?: string | null;
};

/** The place the answer is about: its key in the evidence of who measured what, and its trust-mark path. */
export type FitPlace = { evidenceKey: string; fieldPath: string };

type Checked =
	| { check: 'seat'; box: Box; clearanceMm: number; chosen: SpaceFit | null; spaces: SpaceFit[] }
	| { check: 'dash'; clearanceMm: number; dash: DashPlace; result: DepthFit }
	| { check: 'speaker'; chosen: LocationFit | null; locations: LocationFit[] };

export type FitAnswer<E = unknown> = Checked & {
	place: FitPlace | null;
	/** Who measured the place's figures, when the caller has that record. */
	evidence: E | null;
	/** False when `where` named a place this page does not record (the best one is shown instead). */
	whereFound: boolean;
};

export const seatPlace = (spaceId: string): FitPlace => ({ evidenceKey: `seat:${spaceId}`, fieldPath: `seats.spaces[${spaceId}]` });
export const DASH_PLACE: FitPlace = { evidenceKey: 'dash', fieldPath: 'dash' };
export const speakerPlace = (locationId: string): FitPlace => ({ evidenceKey: `speaker:${locationId}`, fieldPath: `speakers.locations[${locationId}]` });

/** The answer, or null for a seat check with no box yet (no part chosen and nothing typed). */
export function fitAnswer<E>(places: FitPlaces, question: FitQuestion, evidence: Readonly<Record<string, E>> = {}): FitAnswer<E> | null {
	const { part, where } = question;
	const clearanceMm = question.clearanceMm ?? DEFAULT_CLEARANCE_MM;
	const check = part ? partCheck(part.kind) : 'seat';
	const withPlace = (checked: Checked, place: FitPlace | null, whereFound: boolean): FitAnswer<E> => ({
		...checked,
		place,
		evidence: place ? (evidence[place.evidenceKey] ?? null) : null,
		whereFound
	});
	if (check === 'seat') {
		const box = part ? partBox(part) : (question.box ?? null);
		if (!box) return null;
		const spaces = seatSpaceFits(places.seats, box, { clearanceMm });
		const chosen = pickSpace(spaces, where);
		const whereFound = !where || spaces.some((s) => s.spaceId === where || s.seat === where);
		return withPlace({ check, box, clearanceMm, chosen, spaces }, chosen ? seatPlace(chosen.spaceId) : null, whereFound);
	}
	if (check === 'dash') {
		const unit = part as Extract<Part, { kind: 'head-unit' }>;
		const dash: DashPlace = { opening: places.dash.opening, depthMm: places.dash.depthMm, openingWidthMm: places.dash.openingWidthMm ?? null, openingHeightMm: places.dash.openingHeightMm ?? null };
		return withPlace({ check, clearanceMm, dash, result: dashFit(unit, dash, { clearanceMm }) }, DASH_PLACE, true);
	}
	const speaker = part as Extract<Part, { kind: 'speaker' }>;
	const locations = speakerLocationFits(places.speakers, speaker);
	const chosen = pickLocation(locations, where);
	const whereFound = !where || locations.some((l) => l.locationId === where);
	return withPlace({ check, chosen, locations }, chosen ? speakerPlace(chosen.locationId) : null, whereFound);
}

/** The answer in words a customer can be told; null when the page records no place to check. */
export function fitReason(answer: FitAnswer, units: UnitSystem): string | null {
	if (answer.check === 'seat') return answer.chosen ? seatFitReason(answer.chosen, units, answer.clearanceMm) : null;
	if (answer.check === 'dash') return answer.result.reason;
	return answer.chosen ? speakerFitReason(answer.chosen, units) : null;
}
