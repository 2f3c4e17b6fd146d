import type { SectionKey } from '../../domain/content/schema';

export type RevisionRow = {
	id: number;
	vehicleSlug?: string;
	vehicleTitle?: string;
	author: { id: number; name: string };
	summary: string;
	createdAt: string;
	sizeDelta: number;
	sections: SectionKey[];
	hidden: boolean;
	restoresRevisionId: number | null;
	parentId: number | null;
};
