import type { PageServerLoad } from './$types';
import { requireRole } from '$lib/server/auth/guard';
import { asHttpError } from '$lib/server/http';
import { textFields } from '$lib/server/forms';
import { requireVehicle } from '$lib/server/services/vehicles';
import { requirePageRevision } from '$lib/server/services/visibility';
import { listParts, partsByIds } from '$lib/server/services/parts';
import { measurementOrigins, placeReaders } from '$lib/server/services/evidence';
import { trustSummary } from '$lib/server/services/trust';
import { jobSheet } from '$lib/domain/jobSheet';
import { readJobSheetQuery, subwooferDrivers } from '$lib/domain/jobSheetQuery';
import { BODY_STYLE_NAMES, BATTERY_LOCATION_NAMES, type BodyStyle } from '$lib/domain/content/schema';

export const load: PageServerLoad = async ({ locals, params, url }) => {
	const user = requireRole(locals, 'viewer');
	const q = url.searchParams;
	const unit = q.get('unit') === 'in' || (!q.get('unit') && locals.units === 'imperial') ? 'in' : 'mm';
	try {
		const vehicle = await requireVehicle(params.slug);
		const rev = await requirePageRevision(vehicle, user);
		const partIds = [...q.getAll('part').flatMap((v) => v.split(',')), q.get('subPart') ?? ''].filter(Boolean).map(Number);
		const [parts, catalogue, trust, evidence] = await Promise.all([
			partsByIds(partIds),
			listParts(),
			trustSummary(vehicle.id, rev.id, locals.units),
			measurementOrigins(rev, placeReaders(rev.content))
		]);

		const read = readJobSheetQuery(q, unit, rev.content.identity);
		const { lengths, speakers, cores, errors } = read;
		const subDrivers = read.subwoofers ? subwooferDrivers(read.subwoofers, parts) : null;
		if (typeof subDrivers === 'string') errors.subOhms = subDrivers;
		// The subwoofer chosen only as a subwoofer is not another part to mount or cable.
		const chosenIds = new Set(q.getAll('part').flatMap((v) => v.split(',')).map(Number));
		const sheetParts = parts.filter((p) => chosenIds.has(p.id));

		const sheet = jobSheet({
			content: rev.content,
			parts: sheetParts,
			subwoofers:
				read.subwoofers && subDrivers && typeof subDrivers !== 'string'
					? { drivers: subDrivers, ampKey: read.subwoofers.ampKey, bridged: read.subwoofers.bridged, wiring: read.subwoofers.wiring }
					: null,
			vehicleLoadA: read.vehicleLoadA ?? null,
			typedAmps: read.typedAmps,
			box: read.box,
			material: read.material,
			headUnitRemoteA: read.remoteOutA ?? null,
			powerRunId: q.get('run'),
			powerM: lengths.power ?? null,
			groundM: read.grounds ?? null,
			branchM: read.branches ?? null,
			remoteM: lengths.remote ?? null,
			speakerM: lengths.speaker ?? null,
			speakers: speakers ?? null,
			coresPerCable: cores,
			remoteInSpeakerCable: q.get('remoteInCable') === 'on',
			seat: q.get('seat'),
			speakerLocation: q.get('speakerAt')
		});
		const c = rev.content;
		return {
			vehicle: { slug: vehicle.slug, title: vehicle.title, body: BODY_STYLE_NAMES[vehicle.body as BodyStyle] ?? vehicle.body },
			revision: { id: rev.id, by: rev.authorName, at: rev.createdAt.toISOString() },
			page: {
				battery: c.power.batteryLocation ? BATTERY_LOCATION_NAMES[c.power.batteryLocation] : null,
				fuseHolderSpot: c.power.fuseHolderSpot,
				runs: c.power.runs,
				groundPoints: c.power.groundPoints,
				passages: c.firewall.passages,
				seats: c.seats.spaces,
				dash: { opening: c.dash.opening, depthMm: c.dash.depthMm, kit: c.dash.kit, trimSteps: c.dash.trimSteps, featuresKept: c.dash.featuresKept },
				harness: { connectors: c.harness.connectors, factoryAmp: c.harness.factoryAmp, reverseTrigger: c.harness.reverseTrigger, illumination: c.harness.illumination, can: c.harness.can, wires: c.harness.wires },
				speakers: c.speakers.locations,
				removal: c.removal
			},
			parts: sheetParts,
			catalogue: catalogue.map((p) => ({ id: p.id, kind: p.kind, sku: p.sku, name: p.name })),
			sheet,
			evidence,
			trust,
			form: {
				// What was typed comes back as typed, so the form shows it beside the sheet.
				...textFields(q, ['power', 'ground', 'branch', 'remoteOut', 'subPart', 'subCount', 'subCoils', 'subOhms', 'subAmp', 'wiring', 'vehicleLoad', 'remote', 'speaker', 'speakers', 'cores', 'seat', 'speakerAt']),
				parts: sheetParts.map((p) => String(p.id)),
				run: sheet.powerRun.id ?? '',
				material: read.material,
				ampRows: read.ampRows,
				bridged: q.get('bridged') === 'on',
				box: read.box,
				remoteInCable: q.get('remoteInCable') === 'on',
				unit
			},
			customer: read.customer,
			years: { from: rev.content.identity.yearFrom, to: rev.content.identity.yearTo },
			errors,
			units: locals.units,
			printedAt: new Date().toISOString()
		};
	} catch (err) {
		asHttpError(err);
	}
};
