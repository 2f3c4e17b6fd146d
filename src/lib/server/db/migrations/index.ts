import * as foundation from './2026-12-01T10-00-00_foundation';
import * as partsAndTrust from './2026-12-01T12-00-00_parts_and_trust';
import * as accountsWatchReview from './2026-12-01T14-00-00_accounts_watch_review';
import * as photos from './2026-12-01T13-00-00_photos';
import * as rateLimits from './2026-12-01T15-00-00_rate_limits';
import * as revisionPhotos from './2026-12-01T16-00-00_revision_photos';
import * as revisionOrigins from './2026-12-05T02-00-00_revision_origins';
import * as endedSessions from './2026-12-05T03-00-00_ended_sessions';
import * as renderedPages from './2026-12-05T06-00-00_rendered_pages';
import * as loadFigures from './2026-12-05T06-00-00_load_figures';
import * as suggestions from './2026-12-05T06-00-00_suggestions';
import * as mailQueue from './2026-12-05T06-10-00_mail_queue';
import * as renderedPagesKey from './2026-12-05T09-00-00_rendered_pages_key';

/** Every migration, oldest first. Add new ones at the end (see DEVELOPERS.md). */
export const migrations = [foundation, partsAndTrust, accountsWatchReview, photos, rateLimits, revisionPhotos, revisionOrigins, endedSessions, renderedPages, loadFigures, suggestions, mailQueue, renderedPagesKey];
