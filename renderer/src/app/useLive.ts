/** Re-render when the database answer to `query` changes (Dexie liveQuery). */
import { liveQuery } from 'dexie';
import { useEffect, useState } from 'react';

export function useLive<T>(query: () => Promise<T>, deps: unknown[]): T | undefined {
  const [value, setValue] = useState<T | undefined>(undefined);
  useEffect(() => {
    const sub = liveQuery(query).subscribe({
      next: (v) => setValue(() => v),
      error: (e) => console.error('database query failed', e),
    });
    return () => sub.unsubscribe();
    // The caller names what the query depends on, as with useEffect.
  }, deps);
  return value;
}
