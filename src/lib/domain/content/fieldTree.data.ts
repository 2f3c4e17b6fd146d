import type { FieldNode } from './fieldTree';
import { SEARCH_LINES } from './searchLines';
import { BATTERY_LOCATION_NAMES, BODY_STYLE_NAMES, DASH_OPENING_NAMES, FEED_KIND_NAMES, PASSAGE_KIND_NAMES, PUSH_SIDE_NAMES, SEAT_NAMES } from './vocabulary';

// Written by `npm run fields:write` from the rules in schema.ts; do not edit by hand.
// tests/unit/content/fieldTreeData.test.ts fails when this and the rules differ.

export const VEHICLE_FIELD_NODES: FieldNode[] = [
	{
		type: "group",
		key: "identity",
		pattern: "identity",
		children: [
			{
				type: "field",
				key: "make",
				pattern: "identity.make",
				info: {
					label: "make",
					kind: "text",
					search: false
				},
				nullable: false
			},
			{
				type: "field",
				key: "model",
				pattern: "identity.model",
				info: {
					label: "model",
					kind: "text",
					search: false
				},
				nullable: false
			},
			{
				type: "field",
				key: "yearFrom",
				pattern: "identity.yearFrom",
				info: {
					label: "first model year",
					kind: "year"
				},
				nullable: false
			},
			{
				type: "field",
				key: "yearTo",
				pattern: "identity.yearTo",
				info: {
					label: "last model year",
					kind: "year"
				},
				nullable: false
			},
			{
				type: "field",
				key: "body",
				pattern: "identity.body",
				info: {
					label: "body style",
					kind: "choice",
					choices: BODY_STYLE_NAMES,
					edit: {
						label: "Body"
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "market",
				pattern: "identity.market",
				info: {
					label: "market / region",
					kind: "text"
				},
				nullable: false
			},
			{
				type: "field",
				key: "aliases",
				pattern: "identity.aliases",
				info: {
					label: "also sold as",
					kind: "textList",
					edit: {
						noun: "name"
					},
					search: false
				},
				nullable: false
			},
			{
				type: "field",
				key: "vinPatterns",
				pattern: "identity.vinPatterns",
				info: {
					label: "VIN patterns",
					kind: "textList",
					edit: {
						label: "VIN patterns (* or ? for any character)",
						noun: "VIN pattern"
					},
					search: false
				},
				nullable: false
			},
			{
				type: "field",
				key: "notes",
				pattern: "identity.notes",
				info: {
					label: "identity notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Identity"
		}
	},
	{
		type: "group",
		key: "power",
		pattern: "power",
		children: [
			{
				type: "field",
				key: "batteryLocation",
				pattern: "power.batteryLocation",
				info: {
					label: "battery location",
					kind: "choice",
					choices: BATTERY_LOCATION_NAMES,
					search: {
						label: "Battery",
						lowerCase: true
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "fuseHolderSpot",
				pattern: "power.fuseHolderSpot",
				info: {
					label: "fuse holder spot",
					kind: "text",
					edit: {
						label: "Fuse holder spot near the battery"
					},
					search: {
						label: "Fuse holder"
					}
				},
				nullable: false
			},
			{
				type: "list",
				key: "runs",
				pattern: "power.runs",
				info: {
					kind: "list",
					noun: "power run",
					title: "Cable runs from the battery"
				},
				entry: {
					type: "group",
					key: "",
					pattern: "power.runs[]",
					children: [
						{
							type: "field",
							key: "to",
							pattern: "power.runs[].to",
							info: {
								label: "run to",
								kind: "text",
								edit: {
									placeholder: "e.g. boot floor, under passenger seat"
								},
								search: {
									label: "Run to"
								}
							},
							nullable: false
						},
						{
							type: "field",
							key: "lengthM",
							pattern: "power.runs[].lengthM",
							info: {
								label: "length",
								kind: "m"
							},
							nullable: true
						}
					]
				}
			},
			{
				type: "list",
				key: "groundPoints",
				pattern: "power.groundPoints",
				info: {
					kind: "list",
					noun: "ground point",
					title: "Chassis ground points"
				},
				entry: {
					type: "group",
					key: "",
					pattern: "power.groundPoints[]",
					children: [
						{
							type: "field",
							key: "location",
							pattern: "power.groundPoints[].location",
							info: {
								label: "location",
								kind: "text",
								search: {
									label: "Ground"
								}
							},
							nullable: false
						},
						{
							type: "field",
							key: "notes",
							pattern: "power.groundPoints[].notes",
							info: {
								label: "notes",
								kind: "text"
							},
							nullable: false
						}
					]
				}
			},
			{
				type: "field",
				key: "notes",
				pattern: "power.notes",
				info: {
					label: "power & ground notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Power & ground"
		}
	},
	{
		type: "group",
		key: "firewall",
		pattern: "firewall",
		children: [
			{
				type: "list",
				key: "passages",
				pattern: "firewall.passages",
				info: {
					kind: "list",
					noun: "passage",
					searchLine: SEARCH_LINES.passage
				},
				entry: {
					type: "group",
					key: "",
					pattern: "firewall.passages[]",
					children: [
						{
							type: "field",
							key: "location",
							pattern: "firewall.passages[].location",
							info: {
								label: "location",
								kind: "text",
								edit: {
									label: "Where"
								},
								search: false
							},
							nullable: false
						},
						{
							type: "field",
							key: "holeMm",
							pattern: "firewall.passages[].holeMm",
							info: {
								label: "hole size",
								kind: "mm",
								search: {
									label: "Hole"
								}
							},
							nullable: true
						},
						{
							type: "field",
							key: "kind",
							pattern: "firewall.passages[].kind",
							info: {
								label: "kind",
								kind: "choice",
								choices: PASSAGE_KIND_NAMES
							},
							nullable: false
						},
						{
							type: "field",
							key: "pushFrom",
							pattern: "firewall.passages[].pushFrom",
							info: {
								label: "easiest to push from",
								kind: "choice",
								choices: PUSH_SIDE_NAMES
							},
							nullable: false
						},
						{
							type: "field",
							key: "avoid",
							pattern: "firewall.passages[].avoid",
							info: {
								label: "things to avoid",
								kind: "text",
								edit: {
									multiline: true,
									placeholder: "Brake lines, looms…"
								},
								search: {
									label: "Avoid"
								}
							},
							nullable: false
						},
						{
							type: "field",
							key: "tools",
							pattern: "firewall.passages[].tools",
							info: {
								label: "tools that help",
								kind: "text",
								search: {
									label: "Tools"
								},
								edit: {
									multiline: true
								}
							},
							nullable: false
						}
					]
				}
			},
			{
				type: "field",
				key: "notes",
				pattern: "firewall.notes",
				info: {
					label: "firewall notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Firewall pass-through"
		}
	},
	{
		type: "group",
		key: "seats",
		pattern: "seats",
		children: [
			{
				type: "list",
				key: "spaces",
				pattern: "seats.spaces",
				info: {
					kind: "list",
					noun: "seat space",
					grid: "grid grid-cols-2 gap-3 sm:grid-cols-4"
				},
				entry: {
					type: "group",
					key: "",
					pattern: "seats.spaces[]",
					children: [
						{
							type: "field",
							key: "seat",
							pattern: "seats.spaces[].seat",
							info: {
								label: "seat",
								kind: "choice",
								choices: SEAT_NAMES,
								edit: {
									span: "col-span-2 sm:col-span-1"
								},
								search: {
									label: "Seat"
								}
							},
							nullable: false
						},
						{
							type: "field",
							key: "lengthMm",
							pattern: "seats.spaces[].lengthMm",
							info: {
								label: "length",
								kind: "mm"
							},
							nullable: true
						},
						{
							type: "field",
							key: "widthMm",
							pattern: "seats.spaces[].widthMm",
							info: {
								label: "width",
								kind: "mm"
							},
							nullable: true
						},
						{
							type: "field",
							key: "heightMm",
							pattern: "seats.spaces[].heightMm",
							info: {
								label: "height",
								kind: "mm"
							},
							nullable: true
						},
						{
							type: "field",
							key: "obstacles",
							pattern: "seats.spaces[].obstacles",
							info: {
								label: "obstacles",
								kind: "text",
								edit: {
									multiline: true,
									placeholder: "Floor ridge, rail, duct…",
									row: "grid gap-3 sm:grid-cols-2"
								}
							},
							nullable: false
						},
						{
							type: "field",
							key: "travelNotes",
							pattern: "seats.spaces[].travelNotes",
							info: {
								label: "seat travel notes",
								kind: "text",
								edit: {
									multiline: true
								}
							},
							nullable: false
						},
						{
							type: "field",
							key: "boardNeeded",
							pattern: "seats.spaces[].boardNeeded",
							info: {
								label: "mounting board needed",
								kind: "flag",
								edit: {
									label: "A mounting board or spacer is needed"
								}
							},
							nullable: false
						}
					]
				}
			},
			{
				type: "field",
				key: "notes",
				pattern: "seats.notes",
				info: {
					label: "seat space notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Seat space",
			hint: "The usable box under each seat. Leave a size empty if it was not measured."
		}
	},
	{
		type: "group",
		key: "dash",
		pattern: "dash",
		children: [
			{
				type: "field",
				key: "opening",
				pattern: "dash.opening",
				info: {
					label: "dash opening",
					kind: "choice",
					choices: DASH_OPENING_NAMES,
					edit: {
						label: "Opening"
					},
					search: {
						label: "Opening"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "openingWidthMm",
				pattern: "dash.openingWidthMm",
				info: {
					label: "measured opening width",
					kind: "mm",
					edit: {
						label: "Opening width (measured)"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "openingHeightMm",
				pattern: "dash.openingHeightMm",
				info: {
					label: "measured opening height",
					kind: "mm",
					edit: {
						label: "Opening height (measured)"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "depthMm",
				pattern: "dash.depthMm",
				info: {
					label: "usable chassis depth",
					kind: "mm"
				},
				nullable: true
			},
			{
				type: "field",
				key: "kit",
				pattern: "dash.kit",
				info: {
					label: "dash kit and trim",
					kind: "text",
					edit: {
						label: "Dash kit and trim needed",
						row: "grid gap-4"
					},
					search: {
						label: "Kit"
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "trimSteps",
				pattern: "dash.trimSteps",
				info: {
					label: "trim removal steps",
					kind: "textList",
					edit: {
						label: "Trim removal steps, in order",
						noun: "step",
						ordered: true
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "featuresKept",
				pattern: "dash.featuresKept",
				info: {
					label: "factory features to keep",
					kind: "textList",
					edit: {
						noun: "feature"
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "notes",
				pattern: "dash.notes",
				info: {
					label: "dash notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Dash & head unit"
		}
	},
	{
		type: "group",
		key: "harness",
		pattern: "harness",
		children: [
			{
				type: "field",
				key: "factoryAmp",
				pattern: "harness.factoryAmp",
				info: {
					label: "factory amplifier",
					kind: "flag",
					search: false
				},
				nullable: true
			},
			{
				type: "field",
				key: "reverseTrigger",
				pattern: "harness.reverseTrigger",
				info: {
					label: "reverse trigger",
					kind: "text",
					search: {
						label: "Reverse trigger"
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "illumination",
				pattern: "harness.illumination",
				info: {
					label: "illumination",
					kind: "text",
					search: {
						label: "Illumination"
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "connectors",
				pattern: "harness.connectors",
				info: {
					label: "connector notes",
					kind: "text",
					edit: {
						multiline: true
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "can",
				pattern: "harness.can",
				info: {
					label: "CAN notes",
					kind: "text",
					edit: {
						multiline: true,
						row: "grid gap-4"
					}
				},
				nullable: false
			},
			{
				type: "list",
				key: "wires",
				pattern: "harness.wires",
				info: {
					kind: "list",
					noun: "wire",
					title: "Wire table",
					grid: "grid grid-cols-2 gap-3 sm:grid-cols-3",
					searchLine: SEARCH_LINES.wire
				},
				entry: {
					type: "group",
					key: "",
					pattern: "harness.wires[]",
					children: [
						{
							type: "field",
							key: "function",
							pattern: "harness.wires[].function",
							info: {
								label: "function",
								kind: "text",
								edit: {
									span: "col-span-2 sm:col-span-1"
								},
								search: false
							},
							nullable: false
						},
						{
							type: "field",
							key: "colour",
							pattern: "harness.wires[].colour",
							info: {
								label: "colour",
								kind: "text",
								edit: {
									label: "Factory colour"
								},
								search: false
							},
							nullable: false
						},
						{
							type: "field",
							key: "pin",
							pattern: "harness.wires[].pin",
							info: {
								label: "pin",
								kind: "text",
								search: {
									label: "Pin"
								}
							},
							nullable: false
						}
					]
				}
			},
			{
				type: "group",
				key: "ladder",
				pattern: "harness.ladder",
				children: [
					{
						type: "list",
						key: "lines",
						pattern: "harness.ladder.lines",
						info: {
							kind: "list",
							noun: "control line",
							title: "Steering-wheel control ladder",
							grid: "grid gap-3"
						},
						entry: {
							type: "group",
							key: "",
							pattern: "harness.ladder.lines[]",
							children: [
								{
									type: "field",
									key: "name",
									pattern: "harness.ladder.lines[].name",
									info: {
										label: "name",
										kind: "text",
										edit: {
											label: "Line name",
											placeholder: "e.g. SWC 1 (Key 1)"
										},
										search: false
									},
									nullable: false
								},
								{
									type: "list",
									key: "buttons",
									pattern: "harness.ladder.lines[].buttons",
									info: {
										kind: "list",
										noun: "button",
										grid: "grid grid-cols-2 gap-3",
										frame: "border-l-4 border-copper-200 pl-3"
									},
									entry: {
										type: "group",
										key: "",
										pattern: "harness.ladder.lines[].buttons[]",
										children: [
											{
												type: "field",
												key: "name",
												pattern: "harness.ladder.lines[].buttons[].name",
												info: {
													label: "name",
													kind: "text",
													edit: {
														label: "Button",
														placeholder: "e.g. Vol +"
													}
												},
												nullable: false
											},
											{
												type: "field",
												key: "ohms",
												pattern: "harness.ladder.lines[].buttons[].ohms",
												info: {
													label: "resistance",
													kind: "ohm",
													edit: {
														placeholder: "e.g. 680, 2.2k, 4k7"
													}
												},
												nullable: true
											}
										]
									}
								}
							]
						}
					}
				]
			},
			{
				type: "field",
				key: "notes",
				pattern: "harness.notes",
				info: {
					label: "harness notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Harness & integration"
		}
	},
	{
		type: "group",
		key: "boot",
		pattern: "boot",
		children: [
			{
				type: "field",
				key: "floorLengthMm",
				pattern: "boot.floorLengthMm",
				info: {
					label: "floor length",
					kind: "mm",
					edit: {
						label: "Floor length (lip to seat back, at the floor)"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "depthTopMm",
				pattern: "boot.depthTopMm",
				info: {
					label: "depth at the top",
					kind: "mm",
					edit: {
						label: "Depth at the top (where the seat back leans in)"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "floorWidthMm",
				pattern: "boot.floorWidthMm",
				info: {
					label: "floor width",
					kind: "mm"
				},
				nullable: true
			},
			{
				type: "field",
				key: "archWidthMm",
				pattern: "boot.archWidthMm",
				info: {
					label: "width between the wheel arches",
					kind: "mm",
					edit: {
						label: "Between the wheel arches"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "heightMm",
				pattern: "boot.heightMm",
				info: {
					label: "height to the shelf or cover",
					kind: "mm",
					edit: {
						label: "Height to the shelf or cover"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "openingWidthMm",
				pattern: "boot.openingWidthMm",
				info: {
					label: "load opening width",
					kind: "mm",
					edit: {
						row: "grid grid-cols-2 gap-3 sm:grid-cols-3"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "openingHeightMm",
				pattern: "boot.openingHeightMm",
				info: {
					label: "load opening height",
					kind: "mm"
				},
				nullable: true
			},
			{
				type: "field",
				key: "lipHeightMm",
				pattern: "boot.lipHeightMm",
				info: {
					label: "lip height",
					kind: "mm",
					edit: {
						label: "Lip height above the floor"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "passThroughWidthMm",
				pattern: "boot.passThroughWidthMm",
				info: {
					label: "rear-seat pass-through width",
					kind: "mm",
					edit: {
						label: "Pass-through width",
						row: "grid grid-cols-2 gap-3 sm:grid-cols-4"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "passThroughHeightMm",
				pattern: "boot.passThroughHeightMm",
				info: {
					label: "rear-seat pass-through height",
					kind: "mm",
					edit: {
						label: "Pass-through height"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "alternatorIdleA",
				pattern: "boot.alternatorIdleA",
				info: {
					label: "alternator output at idle",
					kind: "amp",
					edit: {
						label: "Alternator at idle",
						placeholder: "e.g. 60"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "alternatorCruiseA",
				pattern: "boot.alternatorCruiseA",
				info: {
					label: "alternator output at cruise",
					kind: "amp",
					edit: {
						label: "Alternator at cruise",
						placeholder: "e.g. 110"
					}
				},
				nullable: true
			},
			{
				type: "field",
				key: "notes",
				pattern: "boot.notes",
				info: {
					label: "boot & cargo notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Boot & cargo",
			hint: "The cargo floor up to the shelf or cover, the opening a box goes through, and the alternator figures for the charging budget. Leave a size empty if it was not measured."
		}
	},
	{
		type: "group",
		key: "speakers",
		pattern: "speakers",
		children: [
			{
				type: "list",
				key: "locations",
				pattern: "speakers.locations",
				info: {
					kind: "list",
					noun: "speaker location",
					grid: "grid grid-cols-2 gap-3 sm:grid-cols-3",
					searchLine: SEARCH_LINES.speakerLocation
				},
				entry: {
					type: "group",
					key: "",
					pattern: "speakers.locations[]",
					children: [
						{
							type: "field",
							key: "location",
							pattern: "speakers.locations[].location",
							info: {
								label: "location",
								kind: "text",
								edit: {
									placeholder: "e.g. front door"
								},
								search: false
							},
							nullable: false
						},
						{
							type: "field",
							key: "nominalSize",
							pattern: "speakers.locations[].nominalSize",
							info: {
								label: "nominal size",
								kind: "text",
								edit: {
									placeholder: "e.g. 6.5\" or 165 mm"
								},
								search: false
							},
							nullable: false
						},
						{
							type: "field",
							key: "impedanceOhm",
							pattern: "speakers.locations[].impedanceOhm",
							info: {
								label: "impedance",
								kind: "ohm",
								edit: {
									placeholder: "e.g. 4"
								}
							},
							nullable: true
						},
						{
							type: "field",
							key: "cutoutMm",
							pattern: "speakers.locations[].cutoutMm",
							info: {
								label: "cut-out",
								kind: "mm"
							},
							nullable: true
						},
						{
							type: "field",
							key: "depthMm",
							pattern: "speakers.locations[].depthMm",
							info: {
								label: "mounting depth",
								kind: "mm"
							},
							nullable: true
						},
						{
							type: "field",
							key: "grille",
							pattern: "speakers.locations[].grille",
							info: {
								label: "grille notes",
								kind: "text"
							},
							nullable: false
						}
					]
				}
			},
			{
				type: "field",
				key: "notes",
				pattern: "speakers.notes",
				info: {
					label: "speaker notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Speakers"
		}
	},
	{
		type: "group",
		key: "camera",
		pattern: "camera",
		children: [
			{
				type: "field",
				key: "mounting",
				pattern: "camera.mounting",
				info: {
					label: "camera mounting",
					kind: "text",
					search: {
						label: "Camera"
					},
					edit: {
						multiline: true
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "triggerSource",
				pattern: "camera.triggerSource",
				info: {
					label: "camera trigger source",
					kind: "text",
					search: {
						label: "Trigger"
					},
					edit: {
						multiline: true
					}
				},
				nullable: false
			},
			{
				type: "list",
				key: "feeds",
				pattern: "camera.feeds",
				info: {
					kind: "list",
					noun: "accessory feed",
					title: "Hard-wire feeds",
					grid: "grid grid-cols-2 gap-3 sm:grid-cols-4",
					searchLine: SEARCH_LINES.feed
				},
				entry: {
					type: "group",
					key: "",
					pattern: "camera.feeds[]",
					children: [
						{
							type: "field",
							key: "name",
							pattern: "camera.feeds[].name",
							info: {
								label: "name",
								kind: "text",
								edit: {
									label: "Feed"
								},
								search: false
							},
							nullable: false
						},
						{
							type: "field",
							key: "kind",
							pattern: "camera.feeds[].kind",
							info: {
								label: "kind",
								kind: "choice",
								choices: FEED_KIND_NAMES
							},
							nullable: false
						},
						{
							type: "field",
							key: "fuseA",
							pattern: "camera.feeds[].fuseA",
							info: {
								label: "fuse",
								kind: "amp",
								edit: {
									placeholder: "e.g. 10"
								}
							},
							nullable: true
						},
						{
							type: "field",
							key: "location",
							pattern: "camera.feeds[].location",
							info: {
								label: "location",
								kind: "text",
								edit: {
									label: "Where"
								},
								search: false
							},
							nullable: false
						}
					]
				}
			},
			{
				type: "field",
				key: "notes",
				pattern: "camera.notes",
				info: {
					label: "camera notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Camera & accessories"
		}
	},
	{
		type: "group",
		key: "removal",
		pattern: "removal",
		children: [
			{
				type: "field",
				key: "steps",
				pattern: "removal.steps",
				info: {
					label: "removal steps",
					kind: "textList",
					edit: {
						label: "What comes out, in order",
						noun: "step",
						ordered: true
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "surprises",
				pattern: "removal.surprises",
				info: {
					label: "surprises",
					kind: "textList",
					edit: {
						noun: "surprise"
					}
				},
				nullable: false
			},
			{
				type: "field",
				key: "notes",
				pattern: "removal.notes",
				info: {
					label: "removal notes",
					kind: "markdown"
				},
				nullable: false
			}
		],
		section: {
			kind: "page-section",
			label: "Removal & surprises"
		}
	},
	{
		type: "list",
		key: "photos",
		pattern: "photos",
		info: {
			kind: "list",
			noun: "photo"
		},
		entry: {
			type: "group",
			key: "",
			pattern: "photos[]",
			children: [
				{
					type: "field",
					key: "section",
					pattern: "photos[].section",
					info: {
						label: "section",
						kind: "section"
					},
					nullable: false
				},
				{
					type: "field",
					key: "itemId",
					pattern: "photos[].itemId",
					info: {
						label: "shows entry",
						kind: "text"
					},
					nullable: true
				},
				{
					type: "field",
					key: "caption",
					pattern: "photos[].caption",
					info: {
						label: "caption",
						kind: "text"
					},
					nullable: false
				},
				{
					type: "field",
					key: "alt",
					pattern: "photos[].alt",
					info: {
						label: "description for screen readers",
						kind: "text"
					},
					nullable: false
				}
			]
		}
	}
];
