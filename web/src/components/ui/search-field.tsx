import { useEffect, useRef, useState } from 'react';
import { Field, Input } from './field';

/**
 * A search box that reports what was typed after a short pause, so each keystroke does not
 * start a request. Follows `value` when it changes from outside (e.g. "Clear filters").
 */
export function SearchField({
  label,
  value,
  onChange,
  placeholder,
  className,
  delayMs = 300,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  placeholder?: string;
  className?: string;
  delayMs?: number;
}) {
  const [text, setText] = useState(value);
  const sent = useRef(value);

  useEffect(() => {
    if (value !== sent.current) {
      sent.current = value;
      setText(value);
    }
  }, [value]);

  useEffect(() => {
    if (text.trim() === sent.current.trim()) return;
    const t = setTimeout(() => {
      sent.current = text.trim();
      onChange(text.trim());
    }, delayMs);
    return () => clearTimeout(t);
  }, [text, delayMs, onChange]);

  return (
    <Field label={label} className={className}>
      {(control) => (
        <Input
          {...control}
          type="search"
          value={text}
          placeholder={placeholder}
          autoComplete="off"
          spellCheck={false}
          onChange={(e) => setText(e.target.value)}
          onKeyDown={(e) => {
            if (e.key === 'Enter') {
              sent.current = text.trim();
              onChange(text.trim());
            }
          }}
        />
      )}
    </Field>
  );
}
