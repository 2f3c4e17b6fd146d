// Cable by American Wire Gauge, in copper or copper-clad aluminium. Gauges are numbers: 0 is 1/0,
// -1 is 2/0, -2 is 3/0, -3 is 4/0.

export const MIN_AWG = -3;
export const MAX_AWG = 40;

// Annealed copper at 20 °C, IEC 60028: 1/58 Ω·mm²/m (≈ 0.017241).
export const COPPER_RESISTIVITY_OHM_MM2_PER_M = 1 / 58;
// IEC 60028 temperature coefficient at 20 °C: R_t = R_20 · (1 + 0.00393 · (t − 20)).
export const COPPER_TEMP_COEFF_PER_C = 0.00393;

// Hard-drawn aluminium at 20 °C, IEC 60889: 0.028264 Ω·mm²/m (about 1/35.4), 61 % of copper's conductivity.
export const ALUMINIUM_RESISTIVITY_OHM_MM2_PER_M = 0.028264;
// IEC 60889 temperature coefficient of aluminium at 20 °C; a CCA core is aluminium, so it takes this one.
export const ALUMINIUM_TEMP_COEFF_PER_C = 0.00403;
// ASTM B566: copper-clad aluminium of the 10 % (by volume) class conducts at least 62.9 % of annealed
// copper (IACS), the 15 % class at least 64.4 %. A reel sold as "CCA" may be either, so the sheet
// works on the 10 % class minimum: the higher resistance, the safe side.
export const CCA_CONDUCTIVITY_SHARE = 0.629;

export const CABLE_MATERIALS = ['copper', 'cca'] as const;
export type CableMaterial = (typeof CABLE_MATERIALS)[number];
export const DEFAULT_MATERIAL: CableMaterial = 'copper';
export const MATERIAL_NAMES: Readonly<Record<CableMaterial, string>> = {
	copper: 'copper (OFC)',
	cca: 'copper-clad aluminium (CCA)'
};

/** Resistivity at 20 °C, Ω·mm²/m: IEC 60028 for copper; for CCA copper's divided by its ASTM B566 share. */
export function resistivityOhmMm2PerM(material: CableMaterial): number {
	return material === 'cca' ? COPPER_RESISTIVITY_OHM_MM2_PER_M / CCA_CONDUCTIVITY_SHARE : COPPER_RESISTIVITY_OHM_MM2_PER_M;
}

/** The material's conductivity as a share of annealed copper's (IACS). */
export const conductivityShare = (material: CableMaterial): number => (material === 'cca' ? CCA_CONDUCTIVITY_SHARE : 1);

const tempCoeff = (material: CableMaterial): number => (material === 'cca' ? ALUMINIUM_TEMP_COEFF_PER_C : COPPER_TEMP_COEFF_PER_C);

/** The material and where its figure comes from, for the basis printed beside an answer. */
export function materialBasis(material: CableMaterial): string {
	return material === 'cca'
		? `copper-clad aluminium (CCA), worked as ${CCA_CONDUCTIVITY_SHARE * 100} % of copper's conductivity (ASTM B566, 10 % class minimum)`
		: 'copper (OFC), IEC 60028 resistivity 1/58 Ω·mm²/m';
}

// Gauges a shop keeps on the reel for amplifier power and ground runs (common practice).
export const STOCKED_POWER_GAUGES: readonly number[] = [0, 2, 4, 6, 8, 10, 12, 14, 16, 18];

export interface AwgWire {
	awg: string;
	diameterMm: number;
	areaMm2: number;
	ohmsPerKm: number;
	material: CableMaterial;
}

function assertGauge(n: number): void {
	if (!Number.isInteger(n) || n < MIN_AWG || n > MAX_AWG) {
		throw new RangeError(`Wire gauge must be a whole AWG size from 4/0 to 40; got ${n}.`);
	}
}

/** ASTM B258: d = 0.127 mm × 92^((36 − n) / 39). */
export function awgDiameterMm(n: number): number {
	assertGauge(n);
	return 0.127 * 92 ** ((36 - n) / 39);
}

export function awgAreaMm2(n: number): number {
	const d = awgDiameterMm(n);
	return (Math.PI / 4) * d * d;
}

/** R = ρ / A per metre, corrected linearly for conductor temperature (IEC 60028, IEC 60889). */
export function conductorOhmsPerKm(areaMm2: number, tempC = 20, material: CableMaterial = DEFAULT_MATERIAL): number {
	if (!(areaMm2 > 0)) throw new RangeError('Conductor area must be more than 0 mm².');
	if (!Number.isFinite(tempC)) throw new RangeError('Conductor temperature must be a number of °C.');
	const r20 = (resistivityOhmMm2PerM(material) / areaMm2) * 1000;
	return r20 * (1 + tempCoeff(material) * (tempC - 20));
}

export const copperOhmsPerKm = (areaMm2: number, tempC = 20): number => conductorOhmsPerKm(areaMm2, tempC, 'copper');

/** Reads "4", "4 AWG", "1/0", "0", "00", "4/0", "0000"; throws RangeError with a readable message. */
export function parseAwg(input: string): number {
	const text = input.trim().toLowerCase().replace(/\s*(awg|ga|gauge)$/, '');
	let n: number;
	const aught = /^([1-4])\/0$/.exec(text);
	if (aught) n = 1 - Number(aught[1]);
	else if (/^0{1,4}$/.test(text)) n = 1 - text.length;
	else if (/^\d{1,2}$/.test(text)) n = Number(text);
	else throw new RangeError(`"${input.trim()}" is not a wire gauge; write e.g. 4, 10 AWG, 1/0 or 2/0.`);
	assertGauge(n);
	return n;
}

export function formatAwg(n: number): string {
	assertGauge(n);
	return n <= 0 ? `${1 - n}/0` : String(n);
}

export function awgWire(n: number, tempC = 20, material: CableMaterial = DEFAULT_MATERIAL): AwgWire {
	const diameterMm = awgDiameterMm(n);
	const areaMm2 = (Math.PI / 4) * diameterMm * diameterMm;
	return { awg: formatAwg(n), diameterMm, areaMm2, ohmsPerKm: conductorOhmsPerKm(areaMm2, tempC, material), material };
}

/** A cross-section in mm² to three significant figures, as a reel's label gives it. */
export function formatMm2(areaMm2: number): string {
	return String(Number(areaMm2.toPrecision(3)));
}

/** How every screen writes a gauge: "4 AWG (21.2 mm²)", the area from the ASTM B258 diameter. */
export function gaugeLabel(n: number): string {
	return `${formatAwg(n)} AWG (${formatMm2(awgAreaMm2(n))} mm²)`;
}
