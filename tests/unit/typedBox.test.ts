import { describe, expect, it } from 'vitest';
import { readTypedBox } from '../../src/lib/domain/typedBox';

describe('a box typed as L × W × H', () => {
	it('reads millimetres, or inches at 25.4 mm each (the international inch, exact by definition)', () => {
		expect(readTypedBox({ l: '300', w: '200', h: '60' }, 'mm')).toEqual({ box: { l: 300, w: 200, h: 60 }, errors: {} });
		expect(readTypedBox({ l: '10', w: '8 in', h: '50 mm' }, 'in').box).toEqual({ l: 254, w: 203.2, h: 50 });
	});

	it('is no box and no complaint while all three are blank', () => {
		expect(readTypedBox({ l: '', w: ' ', h: '' }, 'mm')).toEqual({ box: null, errors: {} });
	});

	it('names each side at fault, even when two have the same fault', () => {
		const read = readTypedBox({ l: 'x', w: 'x', h: '' }, 'mm');
		expect(read.box).toBeNull();
		expect(read.errors.l).toMatch(/^Length: Could not read "x"/);
		expect(read.errors.w).toMatch(/^Width: Could not read "x"/);
		expect(read.errors.l).not.toBe(read.errors.w);
		expect(read.errors.h).toBe("Height: type the box's height.");
		expect(readTypedBox({ l: '300', w: '0', h: '60' }, 'mm').errors).toEqual({ w: 'Width: Must be more than 0.' });
	});
});
