/**
 * The few Electron APIs main.ts and preload.ts use, typed here by hand. Electron is an
 * optional dependency whose binary often cannot be installed (see shared MACHINE notes),
 * so the project must type-check with node_modules/electron absent; these shapes follow
 * Electron's documented signatures (electronjs.org/docs/latest/api) for the parts we use.
 */
import type { WindowOptions } from './window-options.ts';

export interface WebFrameMainLike {
  url: string;
}

export interface IpcMainInvokeEventLike {
  senderFrame: WebFrameMainLike | null;
}

export interface WebContentsLike {
  on(event: 'will-navigate' | 'will-redirect', listener: (event: { preventDefault(): void; url?: string }, url: string) => void): void;
  on(event: 'will-attach-webview', listener: (event: { preventDefault(): void }) => void): void;
  setWindowOpenHandler(handler: (details: { url: string }) => { action: 'deny' | 'allow' }): void;
}

export interface BrowserWindowLike {
  loadURL(url: string): Promise<void>;
  once(event: 'ready-to-show', listener: () => void): void;
  show(): void;
  webContents: WebContentsLike;
}

export interface ProtocolLike {
  registerSchemesAsPrivileged(
    schemes: { scheme: string; privileges: Partial<Record<'standard' | 'secure' | 'supportFetchAPI' | 'stream' | 'corsEnabled' | 'codeCache' | 'bypassCSP', boolean>> }[],
  ): void;
  handle(scheme: string, handler: (request: Request) => Response | Promise<Response>): void;
}

export interface SessionLike {
  setPermissionRequestHandler(handler: (webContents: unknown, permission: string, callback: (granted: boolean) => void) => void): void;
  setPermissionCheckHandler(handler: (webContents: unknown, permission: string) => boolean): void;
}

export interface DialogFilter {
  name: string;
  extensions: string[];
}

export interface ElectronMainLike {
  app: {
    whenReady(): Promise<void>;
    on(event: 'window-all-closed' | 'activate' | 'will-quit', listener: () => void): void;
    on(event: 'web-contents-created', listener: (event: unknown, contents: WebContentsLike) => void): void;
    quit(): void;
    getVersion(): string;
  };
  BrowserWindow: new (options: WindowOptions) => BrowserWindowLike;
  protocol: ProtocolLike;
  session: { defaultSession: SessionLike };
  ipcMain: { handle(channel: string, listener: (event: IpcMainInvokeEventLike, ...args: unknown[]) => unknown): void };
  dialog: {
    showOpenDialog(
      window: BrowserWindowLike,
      options: { title?: string; properties: string[]; filters?: DialogFilter[] },
    ): Promise<{ canceled: boolean; filePaths: string[] }>;
    showSaveDialog(window: BrowserWindowLike, options: { title?: string; defaultPath?: string }): Promise<{ canceled: boolean; filePath?: string }>;
  };
  Menu: { setApplicationMenu(menu: null): void };
}

export interface ElectronPreloadLike {
  contextBridge: { exposeInMainWorld(key: string, api: unknown): void };
  ipcRenderer: { invoke(channel: string, ...args: unknown[]): Promise<unknown> };
}
