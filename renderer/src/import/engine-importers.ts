/** The real importers (engine/import), as the injectable set the worker uses. */
import { detectSource, importEvents, importTracking } from '../../../engine/import/index.ts';
import type { Importers } from './importers.ts';

export const engineImporters: Importers = { detectSource, importEvents, importTracking };
