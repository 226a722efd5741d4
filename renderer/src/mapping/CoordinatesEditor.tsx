import type { CoordinateMapping, LengthUnit, Origin } from '../../../shared-types/index.ts';
import { Choice, Fieldset, NumberField } from './fields.tsx';

const UNITS: [LengthUnit, string][] = [
  ['m', 'metres'],
  ['cm', 'centimetres'],
  ['mm', 'millimetres'],
  ['normalised', 'normalised 0..1'],
];
const ORIGINS: [Origin, string][] = [
  ['centre', 'centre mark'],
  ['bottom_left', 'bottom-left corner'],
  ['top_left', 'top-left corner'],
];

export function CoordinatesEditor({ value, onChange }: { value: CoordinateMapping; onChange: (v: CoordinateMapping) => void }) {
  const set = (patch: Partial<CoordinateMapping>) => onChange({ ...value, ...patch });
  return (
    <Fieldset legend="Coordinates">
      <Choice label="Units" value={value.unit} options={UNITS} onChange={(unit) => set({ unit })} />
      <Choice label="Origin" value={value.origin} options={ORIGINS} onChange={(origin) => set({ origin })} />
      <Choice
        label="y direction"
        value={value.yDown ? 'down' : 'up'}
        options={[
          ['up', 'y grows up (maths)'],
          ['down', 'y grows down (image)'],
        ]}
        onChange={(v) => set({ yDown: v === 'down' })}
      />
      <NumberField label="Pitch length" suffix="m" value={value.pitch.length} min={1} onChange={(length) => set({ pitch: { ...value.pitch, length: length ?? value.pitch.length } })} />
      <NumberField label="Pitch width" suffix="m" value={value.pitch.width} min={1} onChange={(width) => set({ pitch: { ...value.pitch, width: width ?? value.pitch.width } })} />
      <NumberField label="Grid length (file units)" value={value.gridLength} onChange={(gridLength) => onChange(withOptional(value, 'gridLength', gridLength))} />
      <NumberField label="Grid width (file units)" value={value.gridWidth} onChange={(gridWidth) => onChange(withOptional(value, 'gridWidth', gridWidth))} />
    </Fieldset>
  );
}

function withOptional<T extends object, K extends keyof T>(obj: T, key: K, v: T[K] | undefined): T {
  const copy = { ...obj };
  if (v === undefined) delete copy[key];
  else copy[key] = v;
  return copy;
}
