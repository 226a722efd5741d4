/** Screen navigation. Only Sources exists yet; the others say honestly that they come later. */
export type ScreenId = 'sources';

const LATER = ['Sync', 'Review', 'Watch', 'Reels'];

export function NavRail({ current }: { current: ScreenId }) {
  return (
    <nav className="rail" aria-label="Screens">
      <ul>
        <li>
          <button type="button" className="rail-item" aria-current={current === 'sources' ? 'page' : undefined}>
            <span className="rail-key" aria-hidden="true">▪</span> Sources
          </button>
        </li>
        {LATER.map((name) => (
          <li key={name}>
            <button type="button" className="rail-item" disabled aria-describedby="rail-later">
              <span className="rail-key" aria-hidden="true">·</span> {name}
            </button>
          </li>
        ))}
      </ul>
      <p id="rail-later" className="rail-note">
        Sync, Review, Watch and Reels come with a later release.
      </p>
    </nav>
  );
}
