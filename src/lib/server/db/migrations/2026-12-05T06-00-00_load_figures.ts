import { QueryTypes } from 'sequelize';
import type { Migration } from './types';

export const name = '2026-12-05T06-00-00_load_figures';

// Amplifiers gain their rated power at each load, minimum load and bridging; speakers their voice coils.
// The figures live in each part's specs (JSON). A speaker entered with one impedance and no coil figures
// reads as one coil at that impedance, so the wiring calculator can use it; amplifiers start unbridged.
export const up: Migration = async ({ context: q }) => {
	const sql = q.sequelize;
	await sql.transaction(async (transaction) => {
		const rows = await sql.query<{ id: number; kind: string; specs: string }>(
			"SELECT id, kind, specs FROM parts WHERE kind IN ('amplifier', 'speaker') FOR UPDATE",
			{ type: QueryTypes.SELECT, transaction }
		);
		for (const row of rows) {
			const specs = JSON.parse(row.specs) as Record<string, unknown>;
			if (row.kind === 'speaker') {
				specs.voiceCoils ??= 1;
				specs.ohmsPerCoil ??= specs.voiceCoils === 1 ? (specs.impedanceOhm ?? null) : null;
			} else {
				for (const key of ['rms4OhmW', 'rms2OhmW', 'rms1OhmW', 'minLoadOhm', 'bridgedRmsW']) specs[key] ??= null;
				specs.bridgeable ??= false;
			}
			await sql.query('UPDATE parts SET specs = ? WHERE id = ?', { replacements: [JSON.stringify(specs), row.id], transaction });
		}
	});
};

export const down: Migration = async ({ context: q }) => {
	const sql = q.sequelize;
	await sql.transaction(async (transaction) => {
		const rows = await sql.query<{ id: number; specs: string }>("SELECT id, specs FROM parts WHERE kind IN ('amplifier', 'speaker') FOR UPDATE", {
			type: QueryTypes.SELECT,
			transaction
		});
		for (const row of rows) {
			const specs = JSON.parse(row.specs) as Record<string, unknown>;
			for (const key of ['rms4OhmW', 'rms2OhmW', 'rms1OhmW', 'minLoadOhm', 'bridgeable', 'bridgedRmsW', 'voiceCoils', 'ohmsPerCoil']) delete specs[key];
			await sql.query('UPDATE parts SET specs = ? WHERE id = ?', { replacements: [JSON.stringify(specs), row.id], transaction });
		}
	});
};
