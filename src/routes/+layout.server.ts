import type { LayoutServerLoad } from './$types';
import { layoutData } from '$lib/server/views/layout';
import { recordView } from '$lib/server/render/pageMemo';

export const load: LayoutServerLoad = async ({ locals }) => recordView(locals, 'layout', await layoutData(locals));
