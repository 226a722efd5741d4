import { createContext, useContext } from 'react';
import type { HostApi, HostInfo } from '../../../shared-types/index.ts';
import type { WhistlemarkDb } from '../db/database.ts';

export interface AppServices {
  host: HostApi;
  info: HostInfo;
  db: WhistlemarkDb;
}

export const AppContext = createContext<AppServices | null>(null);

export function useServices(): AppServices {
  const s = useContext(AppContext);
  if (!s) throw new Error('useServices outside <AppContext.Provider>');
  return s;
}
