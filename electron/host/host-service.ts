/**
 * The HostApi itself, once, for both hosts. Electron (main.ts) and browser mode
 * (serve.ts) differ only in how files are addressed (`wmfile://` vs `/files/`), whether
 * native dialogs exist, and how calls arrive; everything else is here.
 */
import { readFile } from 'node:fs/promises';
import { homedir, tmpdir, userInfo } from 'node:os';
import { basename, dirname, join } from 'node:path';
import type { FootageProbe } from '../../shared-types/domain.ts';
import type { FilePurpose, HostApi, HostInfo, HostMode, OpenedFile, PlayableFootage, SaveRequest } from '../../shared-types/host-api.ts';
import { saveAtomic } from './atomic-save.ts';
import { openDemoMatch } from './demo.ts';
import { listDirectory } from './directory.ts';
import { playableCopy } from './footage/playable.ts';
import { probeFootageFile } from './footage/probe.ts';
import { OpenedFiles } from './opened-files.ts';
import { findNativeFfmpeg } from './audio/decode-native.ts';
import { NativeSessions } from './export/native-sessions.ts';

export interface HostServiceOptions {
  mode: HostMode;
  /** Builds the URL the renderer uses for an opened file. */
  fileUrl: (fileId: string, name: string) => string;
  demoDir?: string;
  /** Native open dialog (Electron); paths chosen, [] when cancelled. */
  pickPaths?: (purpose: FilePurpose, multiple: boolean) => Promise<string[]>;
  /**
   * Native save dialog (Electron): the full path chosen, or null when cancelled. The
   * dialog itself asks before replacing a file, so a chosen existing path is replaced.
   */
  pickSavePath?: (suggestedName: string, directory?: string) => Promise<string | null>;
  crossOriginIsolated?: boolean;
  /** Version to report; package.json's when absent. */
  appVersion?: string;
  /** Where playable MP4 copies of MPEG-TS footage are kept (default: the system's temporary folder). */
  playableCacheDir?: string;
}

export interface HostService {
  api: HostApi;
  files: OpenedFiles;
  /** Native clip exports in progress (cancelled when the host shuts down). */
  exports: NativeSessions;
}

let packageVersion: Promise<string> | undefined;
/** The project's version from package.json (browser mode; Electron passes its own). */
function readPackageVersion(): Promise<string> {
  packageVersion ??= readFile(new URL('../../package.json', import.meta.url), 'utf8')
    .then((t) => String((JSON.parse(t) as { version?: string }).version ?? 'unknown'))
    .catch(() => 'unknown');
  return packageVersion;
}

function localUserName(): string {
  try {
    return userInfo().username;
  } catch {
    return process.env.USER ?? process.env.USERNAME ?? 'analyst';
  }
}

export function createHostService(opts: HostServiceOptions): HostService {
  const files = new OpenedFiles(opts.fileUrl);
  const probes = new Map<string, { mtimeMs: number; size: number; probe: Promise<FootageProbe> }>();
  let lastSaveDirectory: string | undefined;
  const playables = new Map<string, Promise<PlayableFootage>>();
  const exports = new NativeSessions();

  const api: HostApi = {
    async info(): Promise<HostInfo> {
      return {
        mode: opts.mode,
        appVersion: opts.appVersion ?? (await readPackageVersion()),
        userName: localUserName(),
        nativeDialogs: Boolean(opts.pickPaths),
        crossOriginIsolated: opts.crossOriginIsolated,
        nativeFfmpeg: findNativeFfmpeg() !== null,
      };
    },

    async chooseFiles(purpose, multiple): Promise<OpenedFile[]> {
      if (!opts.pickPaths) {
        throw new Error('chooseFiles: this host has no native file dialog; use the in-app chooser (listDirectory + openPaths)');
      }
      const paths = await opts.pickPaths(purpose, multiple);
      if (paths.length === 0) return [];
      return files.openAll(multiple ? paths : paths.slice(0, 1));
    },

    listDirectory: (path) => listDirectory(path),

    openPaths: (paths) => files.openAll(paths),

    demoMatch: () => openDemoMatch(files, opts.demoDir),

    async probeFootage(fileId): Promise<FootageProbe> {
      const file = files.get(fileId);
      if (!file) throw new Error(`probeFootage: no opened file has id ${fileId}; open the footage first`);
      // Re-open to notice a file replaced on disk; the probe is cached per size + mtime.
      const now = await files.open(file.path);
      const cached = probes.get(fileId);
      if (cached && cached.mtimeMs === now.mtimeMs && cached.size === now.size) return cached.probe;
      const probe = probeFootageFile(now.path);
      probes.set(fileId, { mtimeMs: now.mtimeMs, size: now.size, probe });
      probe.catch(() => probes.delete(fileId));
      return probe;
    },

    async playableFootage(fileId): Promise<PlayableFootage> {
      const file = files.get(fileId);
      if (!file) throw new Error(`playableFootage: no opened file has id ${fileId}; open the footage first`);
      const now = await files.open(file.path);
      const key = `${fileId}\0${now.size}\0${now.mtimeMs}`;
      let job = playables.get(key);
      if (!job) {
        job = (async () => {
          const probe = await api.probeFootage(fileId);
          const copy = await playableCopy(now.path, probe, opts.playableCacheDir ?? join(tmpdir(), 'whistlemark-playable'));
          if (!copy.remuxed) return { ...now, remuxed: false };
          const opened = await files.open(copy.path);
          // The analyst sees the original's name and path; only the URL points at the copy.
          return { ...now, url: opened.url, remuxed: true, mediaOffset: copy.mediaOffset };
        })();
        playables.set(key, job);
        job.catch(() => playables.delete(key));
      }
      return job;
    },

    async saveFile(req: SaveRequest) {
      let directory = req.directory ?? lastSaveDirectory;
      let name = req.suggestedName;
      let overwrite = req.overwrite;
      if (!req.directory && opts.pickSavePath) {
        const picked = await opts.pickSavePath(req.suggestedName, lastSaveDirectory);
        if (!picked) throw new Error('saveFile: cancelled; nothing was written');
        directory = dirname(picked);
        name = basename(picked);
        overwrite = true;
      }
      directory ??= homedir();
      const result = await saveAtomic({ directory, name, bytes: req.bytes, overwrite });
      lastSaveDirectory = dirname(result.path);
      return result;
    },

    async nativeClipStart(req) {
      const file = files.get(req.fileId);
      if (!file) throw new Error(`nativeClipStart: no opened file has id ${req.fileId}; open the footage first`);
      if (!findNativeFfmpeg()) throw new Error('nativeClipStart: no native ffmpeg on PATH; export with the embedded path instead');
      return exports.start(file.path, req);
    },
    nativeClipFrames: (sessionId, batch) => exports.frames(sessionId, batch),
    nativeClipFinish: (sessionId) => exports.finish(sessionId),
    nativeClipCancel: (sessionId) => exports.cancel(sessionId),
  };
  return { api, files, exports };
}
