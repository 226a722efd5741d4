/** Small form pieces shared by the mapping editors. */
import type { ReactNode } from 'react';

export function ColumnSelect(props: { label: string; value: string | undefined; header: string[]; onChange: (v: string | undefined) => void; required?: boolean }) {
  const missing = props.value !== undefined && props.value !== '' && !props.header.includes(props.value);
  return (
    <label className="field">
      <span>
        {props.label}
        {props.required ? ' *' : ''}
      </span>
      <select
        value={props.value ?? ''}
        onChange={(e) => props.onChange(e.target.value || undefined)}
        aria-invalid={(props.required && !props.value) || missing ? true : undefined}
      >
        <option value="">{props.required ? '— choose a column —' : '(none)'}</option>
        {missing && <option value={props.value}>{props.value} (not in this file)</option>}
        {props.header.map((h) => (
          <option key={h} value={h}>
            {h}
          </option>
        ))}
      </select>
    </label>
  );
}

export function Choice<T extends string>(props: { label: string; value: T; options: readonly (readonly [T, string])[]; onChange: (v: T) => void; wide?: boolean }) {
  return (
    <label className={props.wide ? 'field wide' : 'field'}>
      <span>{props.label}</span>
      <select value={props.value} onChange={(e) => props.onChange(e.target.value as T)}>
        {props.options.map(([v, text]) => (
          <option key={v} value={v}>
            {text}
          </option>
        ))}
      </select>
    </label>
  );
}

export function NumberField(props: { label: string; value: number | undefined; onChange: (v: number | undefined) => void; step?: number; min?: number; suffix?: string }) {
  return (
    <label className="field">
      <span>{props.label}</span>
      <span className="with-suffix">
        <input
          type="number"
          value={props.value ?? ''}
          step={props.step ?? 'any'}
          min={props.min}
          onChange={(e) => props.onChange(e.target.value === '' ? undefined : Number(e.target.value))}
        />
        {props.suffix && <span className="suffix">{props.suffix}</span>}
      </span>
    </label>
  );
}

export function Fieldset({ legend, children }: { legend: string; children: ReactNode }) {
  return (
    <fieldset className="group">
      <legend>{legend}</legend>
      <div className="group-grid">{children}</div>
    </fieldset>
  );
}
