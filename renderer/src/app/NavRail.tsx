/** Screen navigation: Alt+1…5 from anywhere (shown beside each name). */
export type ScreenId = 'sources' | 'sync' | 'review' | 'watch' | 'reels';

export const SCREENS: { id: ScreenId; name: string; key: string }[] = [
  { id: 'sources', name: 'Sources', key: '1' },
  { id: 'sync', name: 'Sync', key: '2' },
  { id: 'review', name: 'Review', key: '3' },
  { id: 'watch', name: 'Watch', key: '4' },
  { id: 'reels', name: 'Reels', key: '5' },
];

export function NavRail({ current, onChoose }: { current: ScreenId; onChoose: (s: ScreenId) => void }) {
  return (
    <nav className="rail" aria-label="Screens">
      <ul>
        {SCREENS.map((s) => (
          <li key={s.id}>
            <button
              type="button"
              className="rail-item"
              aria-current={current === s.id ? 'page' : undefined}
              aria-keyshortcuts={`Alt+${s.key}`}
              title={`${s.name} (Alt+${s.key})`}
              onClick={() => onChoose(s.id)}
            >
              <span className="rail-key" aria-hidden="true">{s.key}</span> {s.name}
            </button>
          </li>
        ))}
      </ul>
    </nav>
  );
}

/** The screen an Alt+digit press asks for, if any. */
export function screenForKey(e: { altKey: boolean; ctrlKey: boolean; metaKey: boolean; key: string; code?: string }): ScreenId | undefined {
  if (!e.altKey || e.ctrlKey || e.metaKey) return undefined;
  const digit = e.code?.startsWith('Digit') ? e.code.slice(5) : e.key;
  return SCREENS.find((s) => s.key === digit)?.id;
}
