// The words of a vehicle page: its sections and the choices its fields offer, with the names a
// person reads. Plain data, shared by the page's rules (schema.ts) and every screen.

export const SECTION_KEYS = [
	'identity',
	'power',
	'firewall',
	'seats',
	'dash',
	'harness',
	'boot',
	'speakers',
	'camera',
	'removal'
] as const;
export type SectionKey = (typeof SECTION_KEYS)[number];

export const SECTION_NAMES: Readonly<Record<SectionKey, string>> = {
	identity: 'Identity',
	power: 'Power & ground',
	firewall: 'Firewall pass-through',
	seats: 'Seat space',
	dash: 'Dash & head unit',
	harness: 'Harness & integration',
	boot: 'Boot & cargo',
	speakers: 'Speakers',
	camera: 'Camera & accessories',
	removal: 'Removal & surprises'
};

export const BODY_STYLES = ['sedan', 'hatchback', 'wagon', 'coupe', 'convertible', 'suv', 'pickup', 'van', 'other'] as const;
export type BodyStyle = (typeof BODY_STYLES)[number];
export const BODY_STYLE_NAMES: Readonly<Record<BodyStyle, string>> = {
	sedan: 'Sedan',
	hatchback: 'Hatchback',
	wagon: 'Wagon / estate',
	coupe: 'Coupé',
	convertible: 'Convertible',
	suv: 'SUV',
	pickup: 'Pickup',
	van: 'Van',
	other: 'Other body'
};

export const BATTERY_LOCATIONS = ['engine-bay', 'boot', 'under-seat', 'other'] as const;
export type BatteryLocation = (typeof BATTERY_LOCATIONS)[number];
export const BATTERY_LOCATION_NAMES: Readonly<Record<BatteryLocation, string>> = {
	'engine-bay': 'Engine bay',
	boot: 'Boot / trunk',
	'under-seat': 'Under a seat',
	other: 'Elsewhere'
};

export const PASSAGE_KINDS = ['factory-grommet', 'added-grommet', 'drilled'] as const;
export type PassageKind = (typeof PASSAGE_KINDS)[number];
export const PASSAGE_KIND_NAMES: Readonly<Record<PassageKind, string>> = {
	'factory-grommet': 'Factory grommet',
	'added-grommet': 'Added grommet',
	drilled: 'Drilled hole'
};

export const PUSH_SIDES = ['cabin', 'engine-bay', 'either'] as const;
export type PushSide = (typeof PUSH_SIDES)[number];
export const PUSH_SIDE_NAMES: Readonly<Record<PushSide, string>> = {
	cabin: 'From the cabin',
	'engine-bay': 'From the engine bay',
	either: 'Either side'
};

export const SEATS = ['driver', 'passenger', 'rear'] as const;
export type Seat = (typeof SEATS)[number];
export const SEAT_NAMES: Readonly<Record<Seat, string>> = {
	driver: 'Driver',
	passenger: 'Passenger',
	rear: 'Rear'
};

export const DASH_OPENINGS = ['single-din', '1.5-din', 'double-din', 'oversize', 'kit', 'integrated'] as const;
export type DashOpening = (typeof DASH_OPENINGS)[number];
export const DASH_OPENING_NAMES: Readonly<Record<DashOpening, string>> = {
	'single-din': 'Single DIN',
	'1.5-din': '1.5 DIN',
	'double-din': 'Double DIN',
	oversize: 'Oversize',
	kit: 'Kit opening (the dash kit sets the size)',
	integrated: 'Integrated (no DIN opening)'
};

export const FEED_KINDS = ['constant', 'switched', 'ignition', 'accessory'] as const;
export type FeedKind = (typeof FEED_KINDS)[number];
export const FEED_KIND_NAMES: Readonly<Record<FeedKind, string>> = {
	constant: 'Constant 12 V',
	switched: 'Switched 12 V',
	ignition: 'Ignition',
	accessory: 'Accessory (ACC)'
};
