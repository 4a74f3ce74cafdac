import { useEffect, useId, useRef, type ReactNode } from 'react';
import { NavLink } from 'react-router';
import { cx } from '@/lib/class-names';
import type { PageAccess } from './navigation';

interface MenuGroupProps {
  label: string;
  pages: PageAccess[];
  /** The page on screen belongs to this group. */
  active: boolean;
  open: boolean;
  onOpenChange: (open: boolean) => void;
  /** In the header (opens downwards) or in the bottom bar of a narrow screen (opens upwards, full width). */
  placement?: 'top' | 'bottom';
  icon?: ReactNode;
}

/**
 * One group of the top menu: a button that shows and hides a short list of links (a disclosure,
 * not an application menu, so Tab walks through the links as anywhere else on the page).
 * Escape closes it and puts focus back on its button; a click or focus outside closes it.
 */
export function MenuGroup({ label, pages, active, open, onOpenChange, placement = 'top', icon }: MenuGroupProps) {
  const bottom = placement === 'bottom';
  const listId = useId();
  const rootRef = useRef<HTMLLIElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (!open) return;
    function onPointerDown(event: PointerEvent) {
      if (!rootRef.current?.contains(event.target as Node)) onOpenChange(false);
    }
    document.addEventListener('pointerdown', onPointerDown);
    return () => document.removeEventListener('pointerdown', onPointerDown);
  }, [open, onOpenChange]);

  return (
    <li
      ref={rootRef}
      className={bottom ? 'min-w-0 flex-1' : 'relative flex'}
      onKeyDown={(event) => {
        if (event.key === 'Escape' && open) {
          event.stopPropagation();
          onOpenChange(false);
          buttonRef.current?.focus();
        }
      }}
      onBlur={(event) => {
        // Focus moved on to something outside the group (Tab past its last link, say).
        if (open && event.relatedTarget && !rootRef.current?.contains(event.relatedTarget as Node)) onOpenChange(false);
      }}
    >
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls={listId}
        aria-current={active ? 'true' : undefined}
        onClick={() => onOpenChange(!open)}
        className={
          bottom
            ? cx(
                'flex min-h-14 w-full flex-col items-center justify-center gap-0.5 border-t-2 px-1 text-xs font-medium',
                active ? 'border-accent' : 'border-transparent',
                active || open ? 'text-ink' : 'text-slate',
                open && 'bg-paper',
              )
            : cx(
                'relative flex items-center gap-1 px-3 text-[0.9375rem] font-medium whitespace-nowrap transition-colors',
                'after:absolute after:inset-x-3 after:bottom-0 after:h-0.5 after:rounded-full',
                active ? 'text-ink after:bg-accent' : 'text-slate hover:text-ink after:bg-transparent',
                open && 'text-ink',
              )
        }
      >
        {bottom ? (
          <>
            {icon}
            <span className="max-w-full truncate">{label}</span>
          </>
        ) : (
          <>
            {label}
            <svg
              aria-hidden="true"
              viewBox="0 0 16 16"
              className={cx('size-3.5 shrink-0 transition-transform', open && 'rotate-180')}
              fill="none"
              stroke="currentColor"
              strokeWidth="1.8"
              strokeLinecap="round"
              strokeLinejoin="round"
            >
              <path d="m4 6 4 4 4-4" />
            </svg>
          </>
        )}
      </button>
      <ul
        id={listId}
        hidden={!open}
        className={
          bottom
            ? 'absolute inset-x-0 bottom-full z-40 border-t border-line bg-surface py-1 shadow-lg'
            : 'absolute top-full left-0 z-40 mt-px min-w-48 rounded-b-md border border-line bg-surface py-1 shadow-lg'
        }
      >
        {pages.map((page) => (
          <li key={page.path}>
            <NavLink
              to={page.path}
              onClick={() => onOpenChange(false)}
              className={({ isActive }) =>
                cx(
                  'flex items-center gap-2.5 border-l-2 px-3 text-[0.9375rem] whitespace-nowrap',
                  bottom ? 'min-h-12 px-4' : 'py-2',
                  isActive ? 'border-accent font-medium text-ink' : 'border-transparent text-slate hover:bg-paper hover:text-ink',
                )
              }
            >
              <span className="text-slate">{page.icon}</span>
              {page.groupLabel ?? page.label}
            </NavLink>
          </li>
        ))}
      </ul>
    </li>
  );
}
