/**
 * Preload (sandboxed, context-isolated): exposes the HostApi as `window.whistlemark`
 * and nothing else — one function per call, each a plain ipcRenderer.invoke on its own
 * channel, so the page never touches ipcRenderer itself. Bundled to CommonJS
 * (dist/electron/preload.cjs) by scripts/start.mjs, as sandboxed preloads must be.
 */
import { HOST_CALLS, type HostApi } from '../shared-types/host-api.ts';
import type { ElectronPreloadLike } from './host/electron-shapes.ts';
import { channelFor, unwrapIpcError } from './host/ipc-channels.ts';

const { contextBridge, ipcRenderer } = require('electron') as ElectronPreloadLike;

const api = Object.fromEntries(
  HOST_CALLS.map((call) => [
    call,
    async (...args: unknown[]) => {
      try {
        return await ipcRenderer.invoke(channelFor(call), ...args);
      } catch (e) {
        throw new Error(unwrapIpcError(e));
      }
    },
  ]),
) as unknown as HostApi;

contextBridge.exposeInMainWorld('whistlemark', api);
