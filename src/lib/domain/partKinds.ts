// The kinds of part the catalogue holds, with the names a person reads.

export const PART_KINDS = ['amplifier', 'head-unit', 'speaker', 'enclosure'] as const;
export type PartKind = (typeof PART_KINDS)[number];
export const PART_KIND_NAMES: Readonly<Record<PartKind, string>> = {
	amplifier: 'Amplifier',
	'head-unit': 'Head unit',
	speaker: 'Speaker',
	enclosure: 'Enclosure'
};
export const PART_KIND_PLURALS: Readonly<Record<PartKind, string>> = {
	amplifier: 'Amplifiers',
	'head-unit': 'Head units',
	speaker: 'Speakers',
	enclosure: 'Enclosures'
};

export const AMP_CLASSES = ['A/B', 'D'] as const;
export type AmplifierClass = (typeof AMP_CLASSES)[number];
