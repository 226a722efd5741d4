import type { TeamSide, TrackingLayout, TrackingMapping } from '../../../shared-types/index.ts';
import { CoordinatesEditor } from './CoordinatesEditor.tsx';
import { setColumn } from './edit.ts';
import { Choice, ColumnSelect, Fieldset, NumberField } from './fields.tsx';

const LAYOUTS: [TrackingLayout, string][] = [
  ['wide', 'wide (one row per frame)'],
  ['long', 'long (one row per object and frame)'],
  ['jsonl', 'JSON Lines (one frame per line)'],
];

export function TrackingMappingEditor({ value, header, onChange }: { value: TrackingMapping; header: string[]; onChange: (m: TrackingMapping) => void }) {
  const col = (role: keyof TrackingMapping['columns'], label: string, required = false) => (
    <ColumnSelect label={label} required={required} value={value.columns[role] as string | undefined} header={header} onChange={(c) => onChange(setColumn(value, role, c))} />
  );
  const objects = value.columns.objects ?? [];
  const setObject = (i: number, patch: { team?: TeamSide | undefined; role?: 'player' | 'ball' }) => {
    const next = objects.map((o, j) => {
      if (j !== i) return o;
      const copy = { ...o, ...patch };
      if (patch.team === undefined && 'team' in patch) delete copy.team;
      return copy;
    });
    onChange({ ...value, columns: { ...value.columns, objects: next } });
  };
  return (
    <div className="mapping-editor">
      <Fieldset legend="Layout and clock">
        <Choice wide label="Layout" value={value.layout} options={LAYOUTS} onChange={(layout) => onChange({ ...value, layout })} />
        {col('frame', 'Frame number')}
        {col('time', 'Time')}
        <NumberField label="Frame rate" suffix="Hz" value={value.rate} min={1} onChange={(rate) => onChange(rate === undefined ? dropRate(value) : { ...value, rate })} />
        <Choice
          label="Periods from"
          value={value.periods.from === 'frames' ? 'column' : value.periods.from}
          options={[
            ['column', 'a period column'],
            ['gap', 'a gap in the frames'],
          ]}
          onChange={(from) => onChange({ ...value, periods: from === 'gap' ? { from: 'gap', minGapS: 60 } : { from: 'column' } })}
        />
        {value.periods.from === 'column' && col('period', 'Period', true)}
        {value.periods.from === 'gap' && (
          <NumberField
            label="Shortest break"
            suffix="s"
            value={value.periods.minGapS}
            min={1}
            onChange={(minGapS) => onChange({ ...value, periods: { from: 'gap', minGapS: minGapS ?? 60 } })}
          />
        )}
      </Fieldset>
      {value.layout === 'long' && (
        <Fieldset legend="Object columns">
          {col('objectId', 'Object id', true)}
          {col('team', 'Team')}
          {col('shirt', 'Shirt number')}
          {col('x', 'x', true)}
          {col('y', 'y', true)}
          {col('z', 'Ball height (z)')}
          <label className="field">
            <span>Ball id</span>
            <input value={value.ballId ?? ''} onChange={(e) => onChange(e.target.value ? { ...value, ballId: e.target.value } : dropBall(value))} />
          </label>
        </Fieldset>
      )}
      {value.layout === 'wide' && (
        <fieldset className="group">
          <legend>Objects ({objects.length})</legend>
          <div className="table-scroll short">
            <table className="grid-table">
              <thead>
                <tr>
                  <th>Object</th>
                  <th>x column</th>
                  <th>y column</th>
                  <th>Role</th>
                  <th>Team</th>
                </tr>
              </thead>
              <tbody>
                {objects.map((o, i) => (
                  <tr key={o.id}>
                    <td>{o.id}</td>
                    <td className="mono">{o.x}</td>
                    <td className="mono">{o.y}</td>
                    <td>
                      <select aria-label={`Role of ${o.id}`} value={o.role ?? 'player'} onChange={(e) => setObject(i, { role: e.target.value as 'player' | 'ball' })}>
                        <option value="player">player</option>
                        <option value="ball">ball</option>
                      </select>
                    </td>
                    <td>
                      <select
                        aria-label={`Team of ${o.id}`}
                        value={o.team ?? ''}
                        onChange={(e) => setObject(i, { team: (e.target.value || undefined) as TeamSide | undefined })}
                      >
                        <option value="">—</option>
                        <option value="home">home</option>
                        <option value="away">away</option>
                      </select>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </fieldset>
      )}
      <CoordinatesEditor value={value.coordinates} onChange={(coordinates) => onChange({ ...value, coordinates })} />
    </div>
  );
}

function dropRate(m: TrackingMapping): TrackingMapping {
  const { rate: _r, ...rest } = m;
  return rest;
}
function dropBall(m: TrackingMapping): TrackingMapping {
  const { ballId: _b, ...rest } = m;
  return rest;
}
