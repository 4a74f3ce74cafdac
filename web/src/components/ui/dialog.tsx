import { useEffect, useId, useRef, type ReactNode } from 'react';

/**
 * A modal built on the native `<dialog>`: the browser traps focus, Escape closes it, and focus
 * goes back to what opened it.
 */
export function Dialog({
  open,
  onClose,
  title,
  description,
  children,
}: {
  open: boolean;
  onClose: () => void;
  title: string;
  description?: ReactNode;
  children: ReactNode;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descId = useId();

  useEffect(() => {
    const el = ref.current;
    if (!el) return;
    if (open && !el.open) el.showModal();
    if (!open && el.open) el.close();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descId : undefined}
      onClose={onClose}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className="m-auto w-[min(32rem,calc(100vw-2rem))] rounded-lg border border-line bg-paper p-0 text-ink shadow-xl"
    >
      {open ? (
        <div className="p-5">
          <h2 id={titleId} className="text-lg font-semibold">
            {title}
          </h2>
          {description ? (
            <div id={descId} className="mt-1 text-sm text-slate">
              {description}
            </div>
          ) : null}
          <div className="mt-4">{children}</div>
        </div>
      ) : null}
    </dialog>
  );
}
