/**
 * File-type filters for the native open dialog, by what the analyst is choosing.
 * Example: filtersFor('footage')[0] → { name: 'Footage', extensions: ['mp4', 'mov', …] }
 */
import type { FilePurpose } from '../../shared-types/host-api.ts';
import type { DialogFilter } from './electron-shapes.ts';

const ALL: DialogFilter = { name: 'All files', extensions: ['*'] };

export function filtersFor(purpose: FilePurpose): DialogFilter[] {
  switch (purpose) {
    case 'footage':
      return [{ name: 'Footage', extensions: ['mp4', 'm4v', 'mov', 'mkv', 'webm', 'ts', 'm2t', 'm2ts', 'mts'] }, ALL];
    case 'tracking':
      return [{ name: 'Tracking', extensions: ['csv', 'tsv', 'txt', 'json', 'jsonl', 'xml', 'dat'] }, ALL];
    case 'events':
      return [{ name: 'Event log', extensions: ['csv', 'tsv', 'txt', 'json', 'jsonl', 'xml'] }, ALL];
    case 'mapping':
      return [{ name: 'Mapping', extensions: ['json'] }, ALL];
    case 'project':
      return [{ name: 'Match project', extensions: ['json', 'wmproj'] }, ALL];
    default:
      return [ALL];
  }
}
