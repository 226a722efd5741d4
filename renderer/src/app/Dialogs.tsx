/**
 * Modal dialogs on the native <dialog> element: it traps focus, closes on Escape and
 * gives the right accessibility roles for free.
 */
import { useEffect, useRef, useState, type ReactNode } from 'react';

interface ModalProps {
  title: string;
  onClose: () => void;
  children: ReactNode;
  wide?: boolean;
  label?: string;
}

export function Modal({ title, onClose, children, wide, label }: ModalProps) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (d && !d.open) d.showModal();
    return () => d?.close();
  }, []);
  return (
    <dialog
      ref={ref}
      className={wide ? 'modal modal-wide' : 'modal'}
      aria-label={label ?? title}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
    >
      <h2 className="modal-title">{title}</h2>
      {children}
    </dialog>
  );
}

export function ConfirmDialog(props: { title: string; message: ReactNode; confirmLabel: string; onConfirm: () => void; onCancel: () => void }) {
  return (
    <Modal title={props.title} onClose={props.onCancel}>
      <div className="modal-body">{props.message}</div>
      <div className="modal-actions">
        <button type="button" onClick={props.onCancel} autoFocus>
          Keep it
        </button>
        <button type="button" className="danger" onClick={props.onConfirm}>
          {props.confirmLabel}
        </button>
      </div>
    </Modal>
  );
}

export function PromptDialog(props: { title: string; label: string; initial?: string; submitLabel: string; onSubmit: (v: string) => void; onCancel: () => void }) {
  const [value, setValue] = useState(props.initial ?? '');
  const [error, setError] = useState('');
  return (
    <Modal title={props.title} onClose={props.onCancel}>
      <form
        onSubmit={(e) => {
          e.preventDefault();
          if (!value.trim()) return setError('Give it a name (for example the date and both teams).');
          props.onSubmit(value.trim());
        }}
      >
        <label className="field">
          <span>{props.label}</span>
          <input autoFocus value={value} onChange={(e) => setValue(e.target.value)} aria-invalid={error ? true : undefined} />
        </label>
        {error && <p className="field-error">{error}</p>}
        <div className="modal-actions">
          <button type="button" onClick={props.onCancel}>
            Cancel
          </button>
          <button type="submit" className="primary">
            {props.submitLabel}
          </button>
        </div>
      </form>
    </Modal>
  );
}
