/** The match project file: our own zip of JSON tables and binary chunks (see format.ts). */
export * from './format.ts';
export { writeProjectFile, type WriteOptions } from './write.ts';
export { readProjectFile, type ReadProject } from './read.ts';
export { renumber, largestIds, denseIdMap, visitIds, type IdMap } from './references.ts';
export { sha256Hex, fingerprintFromEnds, MIB } from './sha256.ts';
