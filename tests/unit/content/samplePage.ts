import { emptyContent, type VehicleContent } from '../../../src/lib/domain/content/schema';

// Sample data: an invented vehicle with invented measurements.
export function samplePage(): VehicleContent {
	const page = emptyContent({ make: 'Tarnell', model: 'Brisk', yearFrom: 2010, yearTo: 2014, body: 'hatchback', aliases: ['Brisk Sport'] });
	page.power.batteryLocation = 'boot';
	page.power.runs.push({ id: 'run1', to: 'Boot floor', lengthM: 4.5 });
	page.firewall.passages.push({
		id: 'pass1',
		location: 'Driver side, above the pedal box',
		kind: 'factory-grommet',
		pushFrom: 'engine-bay',
		holeMm: 20,
		avoid: 'Brake line behind the grommet',
		tools: 'Stiff fish wire'
	});
	page.seats.spaces.push(
		{ id: 'drv', seat: 'driver', lengthMm: 410, widthMm: 300, heightMm: 95, obstacles: 'Floor ridge', boardNeeded: true, travelNotes: '' },
		{ id: 'pas', seat: 'passenger', lengthMm: 400, widthMm: null, heightMm: 88.5, obstacles: '', boardNeeded: false, travelNotes: '' }
	);
	page.dash.opening = 'double-din';
	page.dash.depthMm = 160;
	page.dash.trimSteps.push('Pull the vent surround', 'Two screws under the unit');
	page.harness.factoryAmp = false;
	page.harness.ladder.lines.push({
		id: 'l1',
		name: 'SWC 1',
		buttons: [
			{ id: 'b1', name: 'Vol +', ohms: 680 },
			{ id: 'b2', name: 'Vol −', ohms: 2200 }
		]
	});
	page.camera.feeds.push({ id: 'f1', name: 'Camera', kind: 'switched', fuseA: 7.5, location: 'Reverse lamp' });
	page.removal.notes = 'Line one\nLine two';
	return page;
}
