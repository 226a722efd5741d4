/** The go-to field: pick a clock, type a moment, Enter. Mistakes say what to write. */
import { useState, type RefObject } from 'react';
import { CLOCK_LABELS, ClockInputError, goToTarget, type ClockKind, type GoToInput, type GoToTarget } from './clocks.ts';

const EXAMPLES: Record<ClockKind, string> = {
  footage: '1:23.40',
  frame: '2085',
  timecode: '00:01:23:10',
  match: '52:10.4',
  tracking: '81250',
};

export function GoToField({ input, onTarget, disabled, hasFit, inputRef }: { input: GoToInput; onTarget: (t: GoToTarget) => unknown; disabled: boolean; hasFit: boolean; inputRef: RefObject<HTMLInputElement | null> }) {
  const [kind, setKind] = useState<ClockKind>('footage');
  const [text, setText] = useState('');
  const [error, setError] = useState('');
  const example = kind === 'timecode' && input.rate.dropFrame ? '00:01:00;02' : EXAMPLES[kind];
  const go = () => {
    try {
      const target = goToTarget(kind, text, input);
      setError('');
      onTarget(target);
      inputRef.current?.blur();
    } catch (e) {
      if (e instanceof ClockInputError || e instanceof RangeError) setError(e.message);
      else throw e;
    }
  };
  return (
    <form
      className="fp-goto"
      aria-label="Go to a moment"
      onSubmit={(e) => {
        e.preventDefault();
        go();
      }}
    >
      <label>
        Go to
        <select value={kind} onChange={(e) => setKind(e.target.value as ClockKind)} aria-label="Clock" disabled={disabled}>
          {(Object.keys(CLOCK_LABELS) as ClockKind[]).map((k) => (
            <option key={k} value={k} disabled={(k === 'match' || k === 'tracking') && !hasFit}>
              {CLOCK_LABELS[k]}
              {(k === 'match' || k === 'tracking') && !hasFit ? ' (needs a fit)' : ''}
            </option>
          ))}
        </select>
      </label>
      <input
        ref={inputRef}
        className="mono"
        value={text}
        onChange={(e) => setText(e.target.value)}
        onKeyDown={(e) => {
          if (e.key === 'Escape') {
            setError('');
            e.currentTarget.blur();
          }
        }}
        placeholder={example}
        aria-label={`Moment (${CLOCK_LABELS[kind]})`}
        aria-keyshortcuts="G"
        aria-invalid={error ? true : undefined}
        title="G jumps here; Enter goes; Esc leaves"
        disabled={disabled}
        spellCheck={false}
      />
      <button type="submit" disabled={disabled || !text.trim()}>
        Go
      </button>
      {error && (
        <span className="error-text small" role="alert">
          {error}
        </span>
      )}
    </form>
  );
}
