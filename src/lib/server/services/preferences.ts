import { announceAccountChange } from '../events';
import { User } from '../db/models';
import type { UnitSystem } from '../../domain/units';

/** Remembers a person's metric/imperial choice on their account, so every device shows it. */
export async function setUnits(userId: number, units: UnitSystem): Promise<void> {
	await User.update({ units }, { where: { id: userId } });
	announceAccountChange(userId);
}
