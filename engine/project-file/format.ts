/**
 * The match project file (".wmatch"): our own format, documented in the README.
 *
 * A zip archive (PKWARE APPNOTE, written and read with fflate) holding
 *   manifest.json          format name + version, what wrote it, the tables, every entry's size and SHA-256
 *   tables/<table>.json    the project's rows of one database table, as JSON
 *   chunks/<n>.bin         the bytes of one typed array of those rows (little-endian), referenced from the JSON
 * Ids inside the file are dense (1..n per table, in database order); opening renumbers them.
 */

export const FORMAT_NAME = 'whistlemark-match-project';
export const FORMAT_VERSION = 1;
export const MANIFEST_ENTRY = 'manifest.json';
export const FILE_EXTENSION = '.wmatch';

/** The tables a match project carries, in the order they are written and restored. */
export const PROJECT_TABLES = [
  'projects',
  'sources',
  'trackingMeta',
  'trackingBlocks',
  'eventLogs',
  'events',
  'footage',
  'anchors',
  'clockFits',
  'corrections',
  'nonLive',
  'pitchRegistrations',
  'reels',
  'clips',
  'audit',
] as const;
export type ProjectTable = (typeof PROJECT_TABLES)[number];

/** Plain rows of each table, as stored (typed arrays included). */
export type ProjectTables = Record<ProjectTable, Record<string, unknown>[]>;

/** A footage file the project points at: where it was and how to know it again. */
export interface FootageReference {
  /** The footage source's id inside the file. */
  sourceId: number;
  path: string;
  fileName: string;
  fingerprint?: ContentFingerprint;
}

/** Size plus SHA-256 of the first and last MiB: cheap to take, and a moved copy still matches. */
export interface ContentFingerprint {
  size: number;
  headSha256: string;
  tailSha256: string;
}

export interface ManifestEntry {
  size: number;
  sha256: string;
}

export interface ProjectManifest {
  format: typeof FORMAT_NAME;
  formatVersion: number;
  writtenBy: string;
  savedAt: string;
  /** Database schema version the rows come from. */
  databaseVersion: number;
  title: string;
  tables: Record<string, { entry: string; rows: number }>;
  chunks: number;
  entries: Record<string, ManifestEntry>;
  footage: FootageReference[];
}

/** Why a file cannot be opened, in words the analyst can act on. Nothing is changed when it is thrown. */
export class ProjectFileError extends Error {
  constructor(
    message: string,
    readonly reason: 'not-zip' | 'foreign' | 'newer' | 'damaged' | 'invalid',
  ) {
    super(message);
    this.name = 'ProjectFileError';
  }
}
