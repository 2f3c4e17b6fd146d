import * as foundation from './2026-12-01T10-00-00_foundation';

/** Every migration, oldest first. Add new ones at the end (see DEVELOPERS.md). */
export const migrations = [foundation];
