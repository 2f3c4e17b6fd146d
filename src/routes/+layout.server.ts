import type { LayoutServerLoad } from './$types';
import { layoutData } from '$lib/server/views/layout';
import { viewData } from '$lib/server/render/pageMemo';

export const load: LayoutServerLoad = async ({ locals }) => viewData(locals, 'layout', () => layoutData(locals));
