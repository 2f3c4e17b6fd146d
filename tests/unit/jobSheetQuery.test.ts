import { describe, expect, it } from 'vitest';
import { readJobCustomer, readJobSheetQuery, readTypedAmps } from '../../src/lib/domain/jobSheetQuery';
import { readDistribution, emptyDistributionRow } from '../../src/lib/domain/calcInput';

const years = { yearFrom: 2011, yearTo: 2015 };
const q = (s: string) => new URLSearchParams(s);

describe('job sheet address', () => {
	it('reads typed amplifiers row by row, skipping empty rows', () => {
		const r = readTypedAmps(q('ampName=Mids&ampW=80&ampCh=4&ampClass=D&ampA=&ampFuse=40&ampName=&ampW=&ampCh=&ampClass=&ampA=45&ampFuse=60&ampName=&ampW=&ampCh=&ampClass=&ampA=&ampFuse='));
		expect(r.errors).toEqual({});
		expect(r.amps).toEqual([
			{ name: 'Mids', rmsWattsPerChannel: 80, channels: 4, ampClass: 'D', currentA: null, fuseA: 40 },
			{ name: undefined, rmsWattsPerChannel: null, channels: null, ampClass: null, currentA: 45, fuseA: 60 }
		]);
		expect(r.rows).toHaveLength(2);
	});

	it('says which typed amplifier is wrong and why', () => {
		const r = readTypedAmps(q('ampName=Sub&ampW=abc&ampCh=1&ampClass=D&ampA=&ampFuse=&ampName=&ampW=80&ampCh=&ampClass=&ampA=&ampFuse='));
		expect(r.errors.amp1).toBe('Sub: RMS power per channel: "abc" is not a number.');
		expect(r.errors.amp2).toBe('Amplifier 2: give its RMS power per channel and channels, or its current.');
		expect(r.amps).toEqual([]);
	});

	it('reads one length for every amplifier, or a list, in metres or feet', () => {
		const r = readJobSheetQuery(q('power=4.5&ground=0.4, 0.6&branch=0.5'), 'mm', years);
		expect(r.lengths.power).toBe(4.5);
		expect(r.grounds).toEqual([0.4, 0.6]);
		expect(r.branches).toEqual([0.5]);
		// 10 ft × 0.3048 = 3.048 m (international foot)
		expect(readJobSheetQuery(q('power=10'), 'in', years).lengths.power).toBeCloseTo(3.048, 6);
		expect(readJobSheetQuery(q('ground=0.4, x'), 'mm', years).errors.ground).toBeTruthy();
	});

	it('takes copper unless CCA is chosen, and refuses anything else', () => {
		expect(readJobSheetQuery(q(''), 'mm', years).material).toBe('copper');
		expect(readJobSheetQuery(q('material=cca'), 'mm', years).material).toBe('cca');
		expect(readJobSheetQuery(q('material=gold'), 'mm', years).errors.material).toMatch(/choose copper or CCA/);
	});

	it('reads a box handed over by the fit screen, in mm', () => {
		expect(readJobSheetQuery(q('boxL=400&boxW=300&boxH=80'), 'mm', years).box).toEqual({ l: 400, w: 300, h: 80 });
		expect(readJobSheetQuery(q(''), 'mm', years).box).toBeNull();
	});
});

describe('customer details', () => {
	it('checks the VIN by its check digit (49 CFR 565)', () => {
		// The usual worked example of the North American check digit: 1M8GDM9AXKP042788 is valid (check digit X).
		const ok = readJobCustomer(q('customer=Sample Customer&order=WO-1042&vin=1m8gdm9a-xkp042788&year=2012'), years);
		expect(ok.errors).toEqual({});
		expect(ok.customer).toEqual({ customer: 'Sample Customer', order: 'WO-1042', vin: '1M8GDM9AXKP042788', year: '2012' });
		// one character changed in position 9: the other characters still give X
		const typo = readJobCustomer(q('vin=1M8GDM9A1KP042788'), years);
		expect(typo.errors.vin).toMatch(/Check digit \(position 9\) is 1 but the other characters give X/);
		expect(readJobCustomer(q('vin=1M8GDM9AXKP04278'), years).errors.vin).toMatch(/17 characters; this one has 16/);
	});

	it("checks the model year against the page's years", () => {
		expect(readJobCustomer(q('year=2016'), years).errors.year).toMatch(/Model year 2016 is outside the years this page covers \(2011–2015\)/);
		expect(readJobCustomer(q('year=12'), years).errors.year).toMatch(/type four digits/);
		expect(readJobCustomer(q('year=2011'), years).errors).toEqual({});
	});

	it('refuses overlong text with a message', () => {
		expect(readJobCustomer(q(`customer=${'x'.repeat(121)}`), years).errors.customer).toMatch(/under 120 characters/);
	});
});

describe('distribution form', () => {
	it('reads rows and the main run, leaving wholly empty rows out', () => {
		const r = readDistribution(
			[
				{ currentA: '23.5', fuseA: '25', branch: '0.5', ground: '0.3' },
				{ currentA: '47', fuseA: '', branch: '0.7', ground: '0.3' },
				emptyDistributionRow()
			],
			{ mainLength: '2', material: 'cca', remoteOut: '0.5' }
		);
		expect(r).toEqual({
			ok: true,
			input: {
				amps: [
					{ currentA: 23.5, fuseA: 25 },
					{ currentA: 47, fuseA: null }
				],
				mainLengthM: 2,
				branchLengthsM: [0.5, 0.7],
				groundLengthsM: [0.3, 0.3],
				material: 'cca',
				headUnitRemoteA: 0.5
			}
		});
	});

	it('names the row and field of each mistake', () => {
		const r = readDistribution([{ currentA: 'abc', fuseA: '', branch: '0', ground: '0.3' }], { mainLength: '', material: 'copper', remoteOut: '' });
		expect(r.ok).toBe(false);
		if (r.ok) return;
		expect(r.errors['row1.currentA']).toBe('Current: "abc" is not a number.');
		expect(r.errors['row1.branch']).toBeTruthy();
		expect(r.errors.mainLength).toMatch(/Enter the main cable length in metres/);
	});
});
