import { useEffect, useId, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import { buttonClasses, type ButtonVariant } from './button';
import { cn } from './cn';
import { IconCheck, IconChevronDown } from './icons';

export interface MenuItem {
  key: string;
  /** The item's accessible name. */
  label: string;
  /** Extra visible detail under the label (not part of the name). */
  detail?: string;
  /** Marks the item the person is on now. */
  current?: boolean;
  onSelect: () => void;
}

export interface MenuButtonProps {
  /** Visible text of the button; also its accessible name unless `accessibleLabel` is given. */
  label: string;
  /** A fuller name for assistive technology, e.g. "Actions for Pat Example" beside a visible "Actions". */
  accessibleLabel?: string;
  items: MenuItem[];
  icon?: ReactNode;
  variant?: ButtonVariant;
  /** Which edge of the button the menu lines up with. */
  align?: 'start' | 'end';
  /** Open below the button (default) or above it (for buttons at the foot of the screen). */
  side?: 'bottom' | 'top';
  className?: string;
}

/**
 * A button that opens a menu (WAI-ARIA menu button pattern): Enter, Space or the arrow keys
 * open it, arrows move, Home/End jump, Esc closes and returns focus to the button.
 */
export function MenuButton({ label, accessibleLabel, items, icon, variant = 'secondary', align = 'end', side = 'bottom', className }: MenuButtonProps) {
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const itemRefs = useRef<Array<HTMLButtonElement | null>>([]);
  const rootRef = useRef<HTMLDivElement>(null);
  const menuId = useId();

  useEffect(() => {
    if (open) itemRefs.current[active]?.focus();
  }, [open, active]);

  useEffect(() => {
    if (!open) return;
    function onPointerDown(event: PointerEvent) {
      if (rootRef.current && !rootRef.current.contains(event.target as Node)) setOpen(false);
    }
    document.addEventListener('pointerdown', onPointerDown);
    return () => document.removeEventListener('pointerdown', onPointerDown);
  }, [open]);

  function openAt(index: number) {
    setActive(Math.max(0, Math.min(items.length - 1, index)));
    setOpen(true);
  }

  function close(returnFocus: boolean) {
    setOpen(false);
    if (returnFocus) buttonRef.current?.focus();
  }

  const currentIndex = Math.max(0, items.findIndex((i) => i.current));

  function onButtonKeyDown(event: KeyboardEvent<HTMLButtonElement>) {
    if (event.key === 'ArrowDown' || event.key === 'Enter' || event.key === ' ') {
      event.preventDefault();
      openAt(currentIndex);
    } else if (event.key === 'ArrowUp') {
      event.preventDefault();
      openAt(items.length - 1);
    }
  }

  function onMenuKeyDown(event: KeyboardEvent<HTMLDivElement>) {
    const last = items.length - 1;
    switch (event.key) {
      case 'ArrowDown':
        event.preventDefault();
        setActive((i) => (i >= last ? 0 : i + 1));
        break;
      case 'ArrowUp':
        event.preventDefault();
        setActive((i) => (i <= 0 ? last : i - 1));
        break;
      case 'Home':
        event.preventDefault();
        setActive(0);
        break;
      case 'End':
        event.preventDefault();
        setActive(last);
        break;
      case 'Escape':
        event.preventDefault();
        close(true);
        break;
      case 'Tab':
        close(false);
        break;
    }
  }

  return (
    <div ref={rootRef} className={cn('relative', className)}>
      <button
        ref={buttonRef}
        type="button"
        aria-haspopup="menu"
        aria-label={accessibleLabel}
        aria-expanded={open}
        aria-controls={open ? menuId : undefined}
        className={buttonClasses(variant, 'sm')}
        onClick={() => (open ? close(false) : openAt(currentIndex))}
        onKeyDown={onButtonKeyDown}
      >
        {icon}
        <span>{label}</span>
        <IconChevronDown size={18} />
      </button>
      {open && (
        <div
          id={menuId}
          role="menu"
          aria-label={accessibleLabel ?? label}
          onKeyDown={onMenuKeyDown}
          className={cn(
            'absolute z-40 min-w-64 rounded-md border-2 border-line bg-surface p-1 text-ink shadow-raised',
            side === 'bottom' ? 'top-full mt-2' : 'bottom-full mb-2',
            align === 'end' ? 'right-0' : 'left-0',
          )}
        >
          {items.map((item, index) => (
            <button
              key={item.key}
              ref={(el) => {
                itemRefs.current[index] = el;
              }}
              type="button"
              role="menuitem"
              aria-label={item.label}
              aria-current={item.current ? 'true' : undefined}
              tabIndex={index === active ? 0 : -1}
              className={cn(
                'flex min-h-touch w-full items-center gap-3 rounded-sm px-3 py-2 text-left hover:bg-sunk focus-visible:bg-accent-soft',
                item.current && 'font-bold',
              )}
              onClick={() => {
                close(true);
                item.onSelect();
              }}
            >
              <span className="w-5 shrink-0 text-accent">{item.current && <IconCheck size={18} />}</span>
              <span className="flex flex-col">
                <span>{item.label}</span>
                {item.detail && <span className="text-sm font-normal text-ink-muted">{item.detail}</span>}
              </span>
            </button>
          ))}
        </div>
      )}
    </div>
  );
}
