import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { BOX_DEFAULTS, CHARGING_DEFAULTS, COIL_DEFAULTS, readBox, readCharging, readCoilWiring, readSealed } from '../../src/lib/domain/calcInput';

describe('install calculator forms', () => {
	it('subwoofer wiring: counts, coils, bridging and the amplifier', () => {
		expect(readCoilWiring(COIL_DEFAULTS)).toEqual({ ok: true, input: { drivers: [{ count: 2, coils: 2, ohmsPerCoil: 4 }], bridged: false, ampId: null } });
		expect(readCoilWiring({ ...COIL_DEFAULTS, ohmsPerCoil: '2 Ω', bridged: 'on', amp: '7' })).toMatchObject({ ok: true, input: { bridged: true, ampId: 7, drivers: [{ ohmsPerCoil: 2 }] } });
		expect(readCoilWiring({ ...COIL_DEFAULTS, count: '9', coils: '3' })).toEqual({
			ok: false,
			errors: { count: 'Number of drivers must be at most 8.', coils: 'Voice coils must be at most 2.' }
		});
	});

	it('charging: the idle figure is optional, and never above cruise', () => {
		const f = { ...CHARGING_DEFAULTS, alternatorA: '110', vehicleLoadA: '25', addedLoadA: '40 A' };
		// No material picked: copper, the form's stated default.
		expect(readCharging(f)).toEqual({ ok: true, input: { budget: { alternatorA: 110, alternatorIdleA: null, vehicleLoadA: 25, addedLoadA: 40, material: 'copper' }, restingV: null, runningV: null } });
		expect(readCharging({ ...f, restingV: '12.5 V', runningV: 'high' })).toEqual({ ok: false, errors: { runningV: 'Battery running: "high" is not a number.' } });
		expect(readCharging({ ...f, alternatorIdleA: '120' })).toEqual({ ok: false, errors: { alternatorIdleA: "The alternator's output at idle cannot be more than at cruise." } });
		expect(readCharging({ ...f, alternatorA: '' })).toMatchObject({ ok: false, errors: { alternatorA: 'Enter alternator output at cruise in A.' } });
	});

	it('box: sizes in mm or inches, port fields by kind, the schema complaint on its field', () => {
		const box = { ...BOX_DEFAULTS, l: '500', w: '400', h: '350' };
		expect(readBox(box)).toMatchObject({ ok: true, input: { outside: { l: 500, w: 400, h: 350 }, wallMm: 18, driverDisplacementL: 0, port: undefined } });
		// 19.5 in = 495.3 mm (mathjs, international inch)
		const inches = readBox({ ...box, l: '19.5 in' });
		expect(inches.ok && inches.input.outside.l).toBeCloseTo(unit(19.5, 'inch').toNumber('mm'), 6);
		expect(readBox({ ...box, port: 'slot', slotWidthMm: '300', portLengthMm: '200' })).toEqual({ ok: false, errors: { slotHeightMm: 'Enter the slot height in mm.' } });
		expect(readBox({ ...box, port: 'round', diameterMm: '100', portLengthMm: '900' })).toEqual({
			ok: false,
			errors: { portLengthMm: 'A 900 mm port is longer than the box is inside (464 mm at most); fold it or make the box larger.' }
		});
	});

	it('sealed box: Qtc must be above Qts', () => {
		expect(readSealed({ fsHz: '30 Hz', qts: '0.4', vasL: '60 L', qtc: '0.707' })).toEqual({ ok: true, input: { fsHz: 30, qts: 0.4, vasL: 60, qtc: 0.707 } });
		expect(readSealed({ fsHz: '30', qts: '0.8', vasL: '60', qtc: '0.707' })).toEqual({ ok: false, errors: { qtc: "Qtc must be higher than the driver's Qts: a sealed box only ever raises Q." } });
	});
});
