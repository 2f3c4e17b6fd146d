import { describe, expect, it } from 'vitest';
import { readLength } from '../../src/lib/domain/units';
import { modelYearProblem } from '../../src/lib/domain/slug';

describe('run lengths typed into a form', () => {
	it('reads metres or feet and gives run examples, never millimetre ones', () => {
		expect(readLength('m', '4.5', 'mm')).toBe(4.5);
		// 15 ft × 0.3048 m (the international foot, exact by definition) = 4.572 m
		expect(readLength('m', '15', 'in')).toBeCloseTo(4.572, 6);
		expect(() => readLength('m', 'abc', 'mm')).toThrow('Could not read "abc" as a run length; for example 4.5 (metres), 4.5 m, 450 cm or 15 ft.');
		expect(() => readLength('m', 'far', 'in')).toThrow(/for example 15 \(feet\), 15 ft/);
		expect(() => readLength('m', 'abc', 'mm')).not.toThrow(/89 mm/);
		expect(() => readLength('m', '-3', 'mm')).toThrow('A length cannot be negative.');
	});
});

describe('a model year beside a page', () => {
	const page = { yearFrom: 2015, yearTo: 2021 };
	it('says nothing when blank or inside the years the page covers', () => {
		expect(modelYearProblem('', page)).toBeNull();
		expect(modelYearProblem(' 2015 ', page)).toBeNull();
		expect(modelYearProblem('2021', page)).toBeNull();
	});
	it('names the range when the year falls outside it, and asks for four digits otherwise', () => {
		expect(modelYearProblem('2014', page)).toMatch(/^Model year 2014 is outside the years this page covers \(2015–2021\)/);
		expect(modelYearProblem('2022', page)).toMatch(/2022 is outside/);
		expect(modelYearProblem('15', page)).toBe('Model year: type four digits, e.g. 2015.');
		expect(modelYearProblem('2o18', page)).toMatch(/four digits/);
	});
});
