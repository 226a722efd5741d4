/**
 * IPC channel names and error unwrapping shared by electron/main.ts and preload.ts.
 * Example: channelFor('probeFootage') → 'whistlemark:probeFootage'
 */
import type { HostCall } from '../../shared-types/host-api.ts';

export const CHANNEL_PREFIX = 'whistlemark:';

export function channelFor(call: HostCall): string {
  return CHANNEL_PREFIX + call;
}

/**
 * Electron wraps errors thrown in ipcMain.handle as
 * "Error invoking remote method 'whistlemark:x': Error: <message>"; the renderer should
 * see only <message>, the same text browser mode gives.
 */
export function unwrapIpcError(error: unknown): string {
  // Not `instanceof Error`: across the context bridge errors may come from another realm.
  const message =
    typeof error === 'object' && error !== null && typeof (error as { message?: unknown }).message === 'string'
      ? (error as { message: string }).message
      : String(error);
  return message.replace(/^Error invoking remote method '[^']*': (?:[A-Za-z]*Error: )?/, '');
}
