/** Layer toggles per team, team colours, trail length and the distance pair. */
import type { LayerId, OverlayData, OverlaySettings, TeamKey } from '../overlay/contract.ts';
import { LAYER_MENU } from '../overlay/layers/index.ts';
import { fromHex, toHex } from '../overlay/style.ts';

/** The layer a plain key press toggles (player keys Space, arrows, J, K, L, G are never used). */
export function layerForKey(key: string): LayerId | undefined {
  return LAYER_MENU.find((l) => l.key.toLowerCase() === key.toLowerCase())?.id;
}

const TEAMS: TeamKey[] = ['home', 'away'];

export function LayerPanel({ settings, onChange, data }: { settings: OverlaySettings; onChange: (s: OverlaySettings) => void; data: OverlayData | undefined }) {
  const setLayer = (id: LayerId, team: TeamKey, on: boolean) => onChange({ ...settings, layers: { ...settings.layers, [id]: { ...settings.layers[id], [team]: on } } });
  const players = (data?.objects ?? []).filter((o) => o.role === 'player');
  const teamName = (t: TeamKey) => settings.teams[t].name ?? (t === 'home' ? 'Home' : 'Away');
  return (
    <section className="watch-card" aria-label="Overlay layers">
      <h3>Layers</h3>
      <table className="watch-layers">
        <thead>
          <tr>
            <th scope="col">Layer</th>
            {TEAMS.map((t) => (
              <th scope="col" key={t}>
                <span className={`team-chip ${settings.teams[t].shape}`} style={{ background: toHex(settings.teams[t].colour), borderColor: toHex(settings.teams[t].outline) }} aria-hidden="true" />
                {teamName(t)}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {LAYER_MENU.map((l) => (
            <tr key={l.id}>
              <th scope="row" title={`${l.title}: ${l.key} both teams, Shift+${l.key} away only`}>
                {l.title}
                <kbd aria-hidden="true">{l.key}</kbd>
              </th>
              {TEAMS.map((t) => (
                <td key={t}>
                  <input
                    type="checkbox"
                    aria-label={`${l.title} for ${teamName(t)}`}
                    aria-keyshortcuts={t === 'home' ? l.key : `Shift+${l.key}`}
                    checked={settings.layers[l.id][t]}
                    onChange={(e) => setLayer(l.id, t, e.target.checked)}
                  />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      <div className="watch-row">
        {TEAMS.map((t) => (
          <label key={t} className="small">
            {teamName(t)} colour{' '}
            <input type="color" value={toHex(settings.teams[t].colour)} onChange={(e) => onChange({ ...settings, teams: { ...settings.teams, [t]: { ...settings.teams[t], colour: fromHex(e.target.value) } } })} />
          </label>
        ))}
      </div>
      <label className="small watch-row">
        Trail seconds{' '}
        <input type="number" min={0} max={15} step={1} value={settings.trailSeconds} onChange={(e) => onChange({ ...settings, trailSeconds: Math.max(0, Math.min(15, Number(e.target.value) || 0)) })} />
      </label>
      <div className="watch-row small">
        Distance between{' '}
        {[0, 1].map((i) => (
          <select
            key={i}
            aria-label={i ? 'Second player of the distance' : 'First player of the distance'}
            value={settings.distancePair?.[i] ?? ''}
            onChange={(e) => {
              const pair: [string, string] = [...(settings.distancePair ?? ['', ''])] as [string, string];
              pair[i] = e.target.value;
              onChange({ ...settings, distancePair: pair });
            }}
          >
            <option value="">—</option>
            {players.map((p) => (
              <option key={p.id} value={p.id}>
                {p.team === 'home' ? teamName('home') : teamName('away')} {p.shirt ?? p.id}
              </option>
            ))}
          </select>
        ))}
      </div>
    </section>
  );
}
