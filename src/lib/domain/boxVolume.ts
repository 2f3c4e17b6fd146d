import { byKind, checkFigures, literal, number, object, optional, refine, type Rule } from './figureRules';

// A box's net internal volume (the air the driver works against) and a port's tuning frequency.
// Volumes in litres, sizes in millimetres.

/** Speed of sound in air at 20 °C, m/s (from memory: 331.3 + 0.606 × 20 ≈ 343). */
export const SPEED_OF_SOUND_M_S = 343;
// End corrections for a port: the baffle end acts as a flanged pipe end, 0.85 r (Lord Rayleigh, The Theory
// of Sound, from memory); the end inside the box as a free (unflanged) end, 0.6133 r (H. Levine and
// J. Schwinger, Physical Review 73, 1948). Together 1.4633 r, that is 0.732 × the diameter.
export const FLANGED_END_CORRECTION = 0.85;
export const FREE_END_CORRECTION = 0.6133;

export const LITRES_PER_CUBIC_FOOT = 28.316846592;
export const litresToCubicFeet = (litres: number): number => litres / LITRES_PER_CUBIC_FOOT;

const mm = (label: string, max: number) =>
	number(`${label} must be a number of millimetres.`, [(n) => n > 0, `${label} must be more than 0 mm.`], [(n) => n <= max, `${label} over ${max} mm looks like a typo.`]);

export type Port = { kind: 'round'; diameterMm: number; lengthMm: number } | { kind: 'slot'; widthMm: number; heightMm: number; lengthMm: number };

const portLength = mm('Port length', 2000);
const PORT: Rule<Port> = byKind(
	'kind',
	{
		round: object({ kind: literal('round'), diameterMm: mm('Port diameter', 500), lengthMm: portLength }),
		slot: object({ kind: literal('slot'), widthMm: mm('Slot width', 1500), heightMm: mm('Slot height', 1500), lengthMm: portLength })
	},
	'Port kind must be "round" or "slot".'
);

const ENCLOSURE_SHAPE = object({
	outside: object({ l: mm('Outside length', 3000), w: mm('Outside width', 3000), h: mm('Outside height', 3000) }, 'Give the outside size as { l, w, h } in millimetres.'),
	wallMm: mm('Wall thickness', 100),
	driverDisplacementL: number(
		'Driver displacement must be a number of litres.',
		[(n) => n >= 0, 'Driver displacement cannot be negative.'],
		[(n) => n <= 200, 'Driver displacement over 200 L looks like a typo.']
	),
	port: optional(PORT)
});

export interface EnclosureInput {
	outside: { l: number; w: number; h: number };
	wallMm: number;
	driverDisplacementL: number;
	port?: Port;
}

const insideOf = (outside: { l: number; w: number; h: number }, wallMm: number) => ({ l: outside.l - 2 * wallMm, w: outside.w - 2 * wallMm, h: outside.h - 2 * wallMm });
const grossLitres = (inside: { l: number; w: number; h: number }) => (inside.l * inside.w * inside.h) / 1e6;
const portLitres = (port: Port | undefined) => (port ? (portAreaMm2(port) * port.lengthMm) / 1e6 : 0);

// Sizes that cannot make a box are refused with the field at fault, before anything is worked out.
export const ENCLOSURE_INPUT = refine(ENCLOSURE_SHAPE, (v, refuse) => {
	const inside = insideOf(v.outside, v.wallMm);
	if (Math.min(inside.l, inside.w, inside.h) <= 0) {
		refuse(['wallMm'], `Walls of ${v.wallMm} mm leave no room inside a box that size.`);
		return;
	}
	const longest = Math.max(inside.l, inside.w, inside.h);
	if (v.port && v.port.lengthMm > longest) {
		refuse(['port', 'lengthMm'], `A ${v.port.lengthMm} mm port is longer than the box is inside (${longest} mm at most); fold it or make the box larger.`);
		return;
	}
	const gross = grossLitres(inside);
	if (!(gross - v.driverDisplacementL - portLitres(v.port) > 0)) {
		refuse(['driverDisplacementL'], `The driver and port take up more than the ${round(gross, 1)} L inside: nothing is left for the air.`);
	}
});

export interface EnclosureVolume {
	/** Inside sizes, mm: outside less two walls. */
	inside: { l: number; w: number; h: number };
	grossL: number;
	portL: number;
	netL: number;
	netCubicFeet: number;
	/** The port's tuning, Hz; only with a port. */
	tuningHz?: number;
	/** The port's length with both end corrections, mm. */
	effectivePortMm?: number;
}

/** The port's open area, mm². A slot is its width × height. */
export function portAreaMm2(port: Port): number {
	return port.kind === 'round' ? (Math.PI * port.diameterMm ** 2) / 4 : port.widthMm * port.heightMm;
}

/** The radius of a round port of the same area; a slot is taken as that round port (the usual approximation). */
export const portRadiusMm = (port: Port): number => (port.kind === 'round' ? port.diameterMm / 2 : Math.sqrt(portAreaMm2(port) / Math.PI));

/** Physical length plus one flanged and one free end correction. */
export const effectivePortLengthMm = (port: Port): number => port.lengthMm + (FLANGED_END_CORRECTION + FREE_END_CORRECTION) * portRadiusMm(port);

/**
 * Helmholtz resonator: f = c / 2π × √(A / (V × L_eff)), with A the port area, V the net volume and
 * L_eff the port length with its end corrections (L. E. Kinsler et al., Fundamentals of Acoustics, ch. 10).
 */
export function helmholtzHz(netL: number, port: Port): number {
	if (!(netL > 0)) throw new RangeError('The net volume must be more than 0 L.');
	const areaM2 = portAreaMm2(port) / 1e6;
	const volumeM3 = netL / 1000;
	const lengthM = effectivePortLengthMm(port) / 1000;
	return (SPEED_OF_SOUND_M_S / (2 * Math.PI)) * Math.sqrt(areaM2 / (volumeM3 * lengthM));
}

/**
 * Net internal volume: the inside (outside less a wall on each side), less what the driver and the
 * port's air take up. Bracing and a slot port's own wall are counted as driver displacement.
 */
export function enclosureVolume(input: EnclosureInput): EnclosureVolume {
	const { outside, wallMm, driverDisplacementL, port } = checkFigures(ENCLOSURE_INPUT, input);
	const inside = insideOf(outside, wallMm);
	const grossL = grossLitres(inside);
	const portL = portLitres(port);
	const netL = grossL - driverDisplacementL - portL;
	const out: EnclosureVolume = { inside, grossL, portL, netL, netCubicFeet: litresToCubicFeet(netL) };
	if (port) {
		out.tuningHz = helmholtzHz(netL, port);
		out.effectivePortMm = effectivePortLengthMm(port);
	}
	return out;
}

const round = (x: number, d: number) => Number(x.toFixed(d));
