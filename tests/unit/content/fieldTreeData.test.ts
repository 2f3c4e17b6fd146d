import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { fieldTree } from '../../../src/lib/domain/content/fieldRules';
import { fieldTreeModule } from '../../../src/lib/domain/content/fieldTreeSource';
import { FIELD_INFO, VEHICLE_FIELDS } from '../../../src/lib/domain/content/vehicleFields';
import { vehicleContentSchema } from '../../../src/lib/domain/content/schema';
import { BODY_STYLE_NAMES } from '../../../src/lib/domain/content/vocabulary';

// The browser reads the vehicle page's field tree from fieldTree.data.ts; the rules it was
// declared with (schema.ts) must say the same thing, or `npm run fields:write` was forgotten.
describe('the written-out field tree', () => {
	const fromRules = fieldTree(vehicleContentSchema);

	it('is the tree read from the page rules, node for node', () => {
		expect(VEHICLE_FIELDS.top).toEqual(fromRules.top);
		expect(VEHICLE_FIELDS.sections.map((s) => s.key)).toEqual(fromRules.sections.map((s) => s.key));
		expect([...VEHICLE_FIELDS.nodes.keys()]).toEqual([...fromRules.nodes.keys()]);
		expect(FIELD_INFO).toEqual(fromRules.info);
	});

	it('is the text `npm run fields:write` would write', () => {
		const written = readFileSync(new URL('../../../src/lib/domain/content/fieldTree.data.ts', import.meta.url), 'utf8');
		expect(written).toBe(fieldTreeModule(fromRules.top));
	});

	it('points at the shared names and search lines instead of copies', () => {
		// The body style choice is the vocabulary's own object, so a renamed style shows everywhere at once.
		expect(FIELD_INFO['identity.body'].choices).toBe(BODY_STYLE_NAMES);
		const wires = VEHICLE_FIELDS.nodes.get('harness.wires');
		expect(wires?.type === 'list' && wires.info.searchLine?.({ function: 'Speed signal', colour: 'green/white' })).toBe('Speed signal green/white');
	});

	it('tells a changed label or hint apart', () => {
		const identity = fromRules.sections[0];
		const [make, ...rest] = identity.children;
		if (make.type !== 'field') throw new Error('identity.make comes first');
		const relabelled = { ...identity, children: [{ ...make, info: { ...make.info, label: 'maker' } }, ...rest] };
		const hinted = { ...identity, children: [{ ...make, info: { ...make.info, search: undefined } }, ...rest] };
		expect(VEHICLE_FIELDS.sections[0]).toEqual(identity);
		expect(VEHICLE_FIELDS.sections[0]).not.toEqual(relabelled);
		expect(VEHICLE_FIELDS.sections[0]).not.toEqual(hinted);
	});
});
