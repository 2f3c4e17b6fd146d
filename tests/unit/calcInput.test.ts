import { describe, expect, it } from 'vitest';
import { unit } from 'mathjs';
import { AWG_TABLE_GAUGES, readAmpCurrent, readBank, readButtons, readImpedances, readLadder, readNumber, readPowerWire, readResistances, readSpeakerCable } from '../../src/lib/domain/calcInput';
import { AMP_CLASS_EFFICIENCY } from '../../src/lib/domain/power';

describe('calculator forms', () => {
	it('reads numbers and says what is wrong with the rest', () => {
		expect(readNumber('14.4', { label: 'Supply voltage', above: 0 })).toBe(14.4);
		expect(readNumber('3 %', { label: 'Drop', above: 0 })).toBe(3);
		expect(readNumber('14,4', { label: 'Supply voltage' })).toBe('Use a point for decimals: 14.4.');
		expect(readNumber('', { label: 'Current', unit: 'A' })).toBe('Enter current in A.');
		expect(readNumber('2.5', { label: 'Channels', whole: true })).toBe('Channels must be a whole number.');
		expect(readNumber('0', { label: 'Current', unit: 'A', above: 0 })).toBe('Current must be more than 0 A.');
		// A trailing letter is a unit only after a figure: the message repeats what was typed.
		expect(readNumber('abc', { label: 'Current', unit: 'A' })).toBe('Current: "abc" is not a number.');
		expect(readNumber('va', { label: 'Supply voltage' })).toBe('Supply voltage: "va" is not a number.');
		expect(readNumber('12 v', { label: 'Supply voltage' })).toBe(12);
		expect(readNumber('60A', { label: 'Current' })).toBe(60);
	});

	it('takes the class efficiency, or the maker’s own figure in %', () => {
		// class efficiencies are common practice (power.ts)
		const ab = readAmpCurrent({ watts: '75', channels: '2', ampClass: 'AB', volts: '14.4' });
		expect(ab.ok && ab.input.efficiency).toBe(AMP_CLASS_EFFICIENCY.AB);
		const own = readAmpCurrent({ watts: '75', channels: '2', ampClass: 'own', efficiencyPct: '85', volts: '14.4' });
		expect(own.ok && own.input.efficiency).toBeCloseTo(0.85, 12);
		const bad = readAmpCurrent({ watts: '', channels: '0', ampClass: 'own', efficiencyPct: '120', volts: '14.4' });
		expect(!bad.ok && Object.keys(bad.errors).sort()).toEqual(['channels', 'efficiencyPct', 'watts']);
	});

	it('reads run lengths in metres or feet', () => {
		// 16 ft = 4.8768 m (international foot, mathjs)
		const ft = readPowerWire({ currentA: '40', powerLength: '16', groundLength: '18 in', volts: '14.4', maxDropPct: '3' }, 'in');
		expect(ft.ok).toBe(true);
		if (!ft.ok) return;
		expect(ft.input.powerLengthM).toBeCloseTo(unit(16, 'ft').toNumber('m'), 12);
		expect(ft.input.groundLengthM).toBeCloseTo(unit(18, 'inch').toNumber('m'), 12);
		const m = readPowerWire({ currentA: '40', powerLength: '4.8', groundLength: '0', volts: '14.4', maxDropPct: '3' });
		expect(m.ok && m.input).toMatchObject({ powerLengthM: 4.8, groundLengthM: 0 });
		const bad = readPowerWire({ currentA: 'x', powerLength: '45', groundLength: '', volts: '14.4', maxDropPct: '3' });
		expect(!bad.ok && bad.errors).toMatchObject({ currentA: 'Current: "x" is not a number.', powerLength: 'Power run length over 30 m (98 ft) looks like a typo.' });
	});

	it('reads conductor temperature and the amplifiers’ own fuses, with the stated defaults', () => {
		const plain = readPowerWire({ currentA: '40', powerLength: '4.8', groundLength: '0.5', volts: '12', maxDropPct: '3' });
		expect(plain.ok && plain.input).toMatchObject({ tempC: 20, ownFuseA: null });
		const hot = readPowerWire({ currentA: '40', powerLength: '4.8', groundLength: '0.5', volts: '12', maxDropPct: '3', tempC: '-10', ownFuseA: '60 A' });
		expect(hot.ok && hot.input).toMatchObject({ tempC: -10, ownFuseA: 60 });
		const bad = readPowerWire({ currentA: '40', powerLength: '4.8', groundLength: '0.5', volts: '12', maxDropPct: '3', tempC: '400', ownFuseA: 'lots' });
		expect(!bad.ok && Object.keys(bad.errors).sort()).toEqual(['ownFuseA', 'tempC']);
	});

	it('reads button lists with resistor codes', () => {
		// IEC 60062 letter-for-point codes: 2k2 = 2200 Ω, 4R7 = 4.7 Ω
		expect(readButtons('Volume + = 2k2\nMode: 4R7\n1k', 'Line 1')).toEqual({
			name: 'Line 1',
			buttons: [
				{ name: 'Volume +', ohms: 2200 },
				{ name: 'Mode', ohms: 4.7 },
				{ name: 'Button 3', ohms: 1000 }
			]
		});
		expect(readButtons('Next = lots', 'Line 1')).toMatch(/Line 1, Next: could not read "lots" as ohms/);
		const empty = readLadder({ buttons1: '', buttons2: '', tolerancePct: '5' });
		expect(!empty.ok && empty.errors.buttons1).toMatch(/at least one button/);
		expect(readResistances('1k, 2k2')).toEqual([1000, 2200]);
	});

	it('reads the interface circuit of a ladder, with the stated defaults', () => {
		// IEC 60062 letter-for-point codes: 4k7 = 4700 Ω, 100k = 100,000 Ω
		const plain = readLadder({ buttons1: '1k', tolerancePct: '5' });
		expect(plain.ok && plain.input.circuit).toEqual({ pullUpOhms: 4700, vrefV: 5, adcBits: 10, tolerancePct: 5, idleOhms: null });
		const own = readLadder({ buttons1: '1k', tolerancePct: '1', pullUp: '10k', vref: '3.3', adcBits: '12', idle: '100k' });
		expect(own.ok && own.input.circuit).toEqual({ pullUpOhms: 10_000, vrefV: 3.3, adcBits: 12, tolerancePct: 1, idleOhms: 100_000 });
		const bad = readLadder({ buttons1: '1k', tolerancePct: '5', pullUp: '0', vref: 'x', adcBits: '3', idle: 'lots' });
		expect(!bad.ok && Object.keys(bad.errors).sort()).toEqual(['adcBits', 'idle', 'pullUp', 'vref']);
	});

	it('reads speaker counts, impedances and banks', () => {
		expect(readSpeakerCable({ speakers: '4', cores: '4', remote: 'on' })).toEqual({ ok: true, input: { speakers: 4, coresPerCable: 4, includeRemote: true } });
		expect(readSpeakerCable({ speakers: '4', cores: '1' }).ok).toBe(false);
		expect(readImpedances('4, 4; 2')).toEqual([4, 4, 2]);
		expect(readImpedances('4, -2')).toBe('Impedance must be more than 0 Ω.');
		expect(readBank({ bankOhms: '4', inSeries: '2', parallel: '2' })).toEqual({ ok: true, input: { ohms: 4, inSeries: 2, parallel: 2 } });
	});

	it('covers the gauges from 4/0 to 20', () => {
		expect(AWG_TABLE_GAUGES[0]).toBe(-3);
		expect(AWG_TABLE_GAUGES[AWG_TABLE_GAUGES.length - 1]).toBe(20);
		expect(AWG_TABLE_GAUGES).toHaveLength(24);
	});
});
