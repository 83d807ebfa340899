import { useEffect, useId, useRef, type ReactNode, type RefObject } from 'react';
import { createPortal } from 'react-dom';
import { Button } from './button';
import { cn } from './cn';
import { IconClose } from './icons';

const focusableSelector = [
  'a[href]',
  'button:not([disabled])',
  'input:not([disabled]):not([type="hidden"])',
  'select:not([disabled])',
  'textarea:not([disabled])',
  '[tabindex]:not([tabindex="-1"])',
].join(',');

function focusablesIn(root: HTMLElement): HTMLElement[] {
  return Array.from(root.querySelectorAll<HTMLElement>(focusableSelector)).filter((el) => !el.hasAttribute('inert'));
}

export interface DialogProps {
  open: boolean;
  /** Called on Esc, the close button or a click on the backdrop. */
  onClose: () => void;
  title: string;
  description?: ReactNode;
  children?: ReactNode;
  /** Buttons at the foot of the dialog. */
  footer?: ReactNode;
  /** Element to focus on open; defaults to the first focusable element. */
  initialFocusRef?: RefObject<HTMLElement | null>;
  /** `alertdialog` for confirmations that interrupt. */
  role?: 'dialog' | 'alertdialog';
  className?: string;
}

/**
 * A modal dialog: focus moves in, Tab and Shift+Tab stay inside, Esc closes, and focus goes
 * back to what had it before.
 */
export function Dialog({ open, onClose, title, description, children, footer, initialFocusRef, role = 'dialog', className }: DialogProps) {
  const panelRef = useRef<HTMLDivElement>(null);
  const titleId = useId();
  const descriptionId = useId();
  const onCloseRef = useRef(onClose);
  useEffect(() => {
    onCloseRef.current = onClose;
  }, [onClose]);

  useEffect(() => {
    if (!open) return;
    const previous = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    const panel = panelRef.current;
    if (panel) {
      const target = initialFocusRef?.current ?? focusablesIn(panel)[0] ?? panel;
      target.focus();
    }
    const { overflow } = document.body.style;
    document.body.style.overflow = 'hidden';

    function onKeyDown(event: KeyboardEvent) {
      if (event.key === 'Escape') {
        event.stopPropagation();
        onCloseRef.current();
        return;
      }
      if (event.key !== 'Tab' || !panel) return;
      const items = focusablesIn(panel);
      const first = items[0];
      const last = items[items.length - 1];
      if (!first || !last) {
        event.preventDefault();
        return;
      }
      const active = document.activeElement;
      if (event.shiftKey && (active === first || !panel.contains(active))) {
        event.preventDefault();
        last.focus();
      } else if (!event.shiftKey && (active === last || !panel.contains(active))) {
        event.preventDefault();
        first.focus();
      }
    }
    document.addEventListener('keydown', onKeyDown, true);
    return () => {
      document.removeEventListener('keydown', onKeyDown, true);
      document.body.style.overflow = overflow;
      previous?.focus();
    };
  }, [open, initialFocusRef]);

  if (!open) return null;

  return createPortal(
    <div className="fixed inset-0 z-50 flex items-end justify-center p-4 sm:items-center">
      <div className="absolute inset-0 bg-scrim" aria-hidden="true" onClick={() => onClose()} />
      <div
        ref={panelRef}
        role={role}
        aria-modal="true"
        aria-labelledby={titleId}
        aria-describedby={description ? descriptionId : undefined}
        tabIndex={-1}
        className={cn('relative flex max-h-[90vh] w-full max-w-lg flex-col rounded-lg border-2 border-line bg-surface text-ink shadow-raised', className)}
      >
        <div className="flex items-start justify-between gap-4 border-b border-line p-4">
          <div>
            <h2 id={titleId} className="text-lg font-bold">
              {title}
            </h2>
            {description && (
              <div id={descriptionId} className="mt-1 text-ink-muted">
                {description}
              </div>
            )}
          </div>
          <button
            type="button"
            onClick={() => onClose()}
            className="inline-flex min-h-touch min-w-touch items-center justify-center rounded-md text-ink hover:bg-sunk"
            aria-label="Close"
          >
            <IconClose />
          </button>
        </div>
        {children && <div className="overflow-auto p-4">{children}</div>}
        {footer && <div className="flex flex-wrap justify-end gap-2 border-t border-line p-4">{footer}</div>}
      </div>
    </div>,
    document.body,
  );
}

export interface ConfirmDialogProps {
  open: boolean;
  onCancel: () => void;
  onConfirm: () => void;
  title: string;
  /** Say what will be lost or changed. */
  message: ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  /** Destructive confirmations use the danger colour and focus Cancel first. */
  destructive?: boolean;
  loading?: boolean;
}

/** Asks before doing something; the destructive kind starts on Cancel so Enter does no harm. */
export function ConfirmDialog({
  open,
  onCancel,
  onConfirm,
  title,
  message,
  confirmLabel,
  cancelLabel = 'Cancel',
  destructive = false,
  loading = false,
}: ConfirmDialogProps) {
  const cancelRef = useRef<HTMLButtonElement>(null);
  return (
    <Dialog
      open={open}
      onClose={onCancel}
      title={title}
      description={message}
      role="alertdialog"
      initialFocusRef={destructive ? cancelRef : undefined}
      footer={
        <>
          <Button ref={cancelRef} variant="secondary" onClick={onCancel}>
            {cancelLabel}
          </Button>
          <Button variant={destructive ? 'danger' : 'primary'} loading={loading} onClick={onConfirm}>
            {confirmLabel}
          </Button>
        </>
      }
    />
  );
}

export interface FormDialogFooterProps {
  /** The id of the `<form>` inside the dialog that the submit button sends. */
  formId: string;
  submitLabel: string;
  loading?: boolean;
  onCancel: () => void;
}

/** The footer of a dialog that holds a form: Cancel, then the submit button for that form. */
export function FormDialogFooter({ formId, submitLabel, loading = false, onCancel }: FormDialogFooterProps) {
  return (
    <>
      <Button variant="secondary" onClick={onCancel}>
        Cancel
      </Button>
      <Button type="submit" form={formId} loading={loading}>
        {submitLabel}
      </Button>
    </>
  );
}
