/** The calculators, in the order a power install needs them. */
export const CALCULATORS = [
	{ href: '/calc/amp-current', name: 'Amplifier current', blurb: 'Battery current from RMS power, channels and amplifier class.' },
	{ href: '/calc/power-wire', name: 'Power wire and fuse', blurb: 'Smallest gauge for the run and a drop target, and the fuse that protects it.' },
	{ href: '/calc/distribution', name: 'Several amplifiers on one run', blurb: 'Main cable and fuse, a fused branch and a ground lead for each amplifier, and the remote turn-on.' },
	{ href: '/calc/awg', name: 'Wire gauge table', blurb: 'AWG diameter, area and resistance of copper or CCA, at any cable temperature.' },
	{ href: '/calc/speaker-cable', name: 'Speaker cable plan', blurb: 'Conductors and multi-core cables for the speakers and the remote lead.' },
	{ href: '/calc/impedance', name: 'Speaker impedance', blurb: 'Series, parallel and series-parallel banks: the load the amplifier sees.' },
	{ href: '/calc/coil-wiring', name: 'Subwoofer wiring', blurb: 'Every wiring of single or dual voice coils, bridged or not, against an amplifier.' },
	{ href: '/calc/charging', name: 'Charging budget', blurb: 'Does the alternator keep up at idle and cruise, and when to upgrade the charging cables.' },
	{ href: '/calc/box-volume', name: 'Box volume and port', blurb: 'Net volume from outside sizes, and the tuning of a round or slot port.' },
	{ href: '/calc/sealed-box', name: 'Sealed box', blurb: 'Box volume for a chosen Qtc from the driver’s Fs, Qts and Vas.' },
	{ href: '/calc/ladder', name: 'Steering-wheel ladder', blurb: 'Do two control lines collide on one input, and which resistor parts them.' }
] as const;
