import { EVENT_KINDS, type EventClockStyle, type EventKind, type EventMapping, type TeamSide } from '../../../shared-types/index.ts';
import { CoordinatesEditor } from './CoordinatesEditor.tsx';
import { kindNameRows, setColumn, teamNameRows } from './edit.ts';
import { Choice, ColumnSelect, Fieldset } from './fields.tsx';

const CLOCKS: [EventClockStyle, string][] = [
  ['match_clock_continuing', 'MM:SS, second half goes on from 45:00'],
  ['match_clock_restarting', 'MM:SS, each period from 0:00'],
  ['seconds', 'seconds since the period began'],
  ['iso8601', 'wall clock (ISO 8601)'],
];

export function EventMappingEditor(props: { value: EventMapping; header: string[]; preview: string[][]; onChange: (m: EventMapping) => void }) {
  const { value, header, preview, onChange } = props;
  const col = (role: keyof EventMapping['columns'], label: string, required = false) => (
    <ColumnSelect label={label} required={required} value={value.columns[role]} header={header} onChange={(c) => onChange(setColumn(value, role, c))} />
  );
  const kinds = kindNameRows(value, header, preview);
  const teams = teamNameRows(value, header, preview);
  return (
    <div className="mapping-editor">
      <Fieldset legend="Columns">
        {col('time', 'Time', true)}
        {col('kind', 'Event kind', true)}
        {col('period', 'Period')}
        {col('team', 'Team')}
        {col('player', 'Player')}
        {col('x', 'x')}
        {col('y', 'y')}
        {col('endX', 'End x')}
        {col('endY', 'End y')}
        <Choice wide label="Clock style" value={value.clock} options={CLOCKS} onChange={(clock) => onChange({ ...value, clock })} />
      </Fieldset>
      <div className="two-col">
        <fieldset className="group">
          <legend>Kind names</legend>
          {kinds.length === 0 ? (
            <p className="muted">Choose the event kind column to list its names.</p>
          ) : (
            <div className="table-scroll short">
              <table className="grid-table">
                <thead>
                  <tr>
                    <th>In the file</th>
                    <th>Means</th>
                  </tr>
                </thead>
                <tbody>
                  {kinds.map((name) => (
                    <tr key={name}>
                      <td className="mono">{name}</td>
                      <td>
                        <select
                          aria-label={`Kind for ${name}`}
                          value={value.kindNames[name] ?? 'other'}
                          onChange={(e) => onChange({ ...value, kindNames: { ...value.kindNames, [name]: e.target.value as EventKind } })}
                        >
                          {EVENT_KINDS.map((k) => (
                            <option key={k} value={k}>
                              {k.replace(/_/g, ' ')}
                            </option>
                          ))}
                        </select>
                        {value.kindNames[name] === undefined && <span className="tag warn">new</span>}
                      </td>
                    </tr>
                  ))}
                </tbody>
              </table>
            </div>
          )}
        </fieldset>
        <fieldset className="group">
          <legend>Team names</legend>
          {teams.length === 0 ? (
            <p className="muted">Choose the team column to list its names.</p>
          ) : (
            <table className="grid-table">
              <thead>
                <tr>
                  <th>In the file</th>
                  <th>Side</th>
                </tr>
              </thead>
              <tbody>
                {teams.map((name) => (
                  <tr key={name}>
                    <td>{name}</td>
                    <td>
                      <select
                        aria-label={`Side for ${name}`}
                        value={value.teamNames[name] ?? ''}
                        onChange={(e) => {
                          const teamNames = { ...value.teamNames };
                          if (e.target.value) teamNames[name] = e.target.value as TeamSide;
                          else delete teamNames[name];
                          onChange({ ...value, teamNames });
                        }}
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
          )}
        </fieldset>
      </div>
      <CoordinatesEditor value={value.coordinates} onChange={(coordinates) => onChange({ ...value, coordinates })} />
    </div>
  );
}
