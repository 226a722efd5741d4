// A recording stand-in for the `electron` module, for tests/host/electron-main.test.ts:
// the real binary cannot be installed here. It records what main.ts asks of Electron
// (schemes, protocol handlers, IPC handlers, windows, session handlers) on
// globalThis.__wmFakeElectron so the test can drive those handlers directly.
const state = {
  privileged: null,
  registeredBeforeReady: false,
  ready: false,
  protocols: {},
  ipc: {},
  windows: [],
  appListeners: {},
  permissionRequest: null,
  permissionCheck: null,
  openDialogResult: { canceled: true, filePaths: [] },
  saveDialogResult: { canceled: true },
  menu: undefined,
};
globalThis.__wmFakeElectron = state;

class BrowserWindow {
  constructor(options) {
    this.options = options;
    this.loaded = [];
    this.listeners = {};
    this.webContents = { on() {}, setWindowOpenHandler() {} };
    state.windows.push(this);
  }
  loadURL(url) {
    this.loaded.push(url);
    return Promise.resolve();
  }
  once(event, listener) {
    this.listeners[event] = listener;
  }
  show() {
    this.shown = true;
  }
}

module.exports = {
  app: {
    whenReady() {
      state.ready = true;
      return Promise.resolve();
    },
    on(event, listener) {
      (state.appListeners[event] ??= []).push(listener);
    },
    quit() {
      state.quit = true;
    },
    getVersion: () => '0.0.0-test',
  },
  BrowserWindow,
  protocol: {
    registerSchemesAsPrivileged(schemes) {
      state.privileged = schemes;
      state.registeredBeforeReady = !state.ready;
    },
    handle(scheme, handler) {
      state.protocols[scheme] = handler;
    },
  },
  session: {
    defaultSession: {
      setPermissionRequestHandler(h) {
        state.permissionRequest = h;
      },
      setPermissionCheckHandler(h) {
        state.permissionCheck = h;
      },
    },
  },
  ipcMain: {
    handle(channel, listener) {
      state.ipc[channel] = listener;
    },
  },
  dialog: {
    showOpenDialog: async (_win, options) => {
      state.lastOpenDialog = options;
      return state.openDialogResult;
    },
    showSaveDialog: async (_win, options) => {
      state.lastSaveDialog = options;
      return state.saveDialogResult;
    },
  },
  Menu: {
    setApplicationMenu(menu) {
      state.menu = menu;
    },
  },
};
