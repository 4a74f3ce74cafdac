import { useEffect, useRef, useState } from 'react';

/**
 * A form's state kept in localStorage under `key` as it changes, so a reload or a dropped
 * connection loses nothing. `restored` is true when a saved draft was loaded; `clear()` forgets it.
 */
export function useDraft<T>(key: string, initial: () => T) {
  const [restored, setRestored] = useState(false);
  const [value, setValue] = useState<T>(() => {
    try {
      const raw = localStorage.getItem(key);
      if (raw) return JSON.parse(raw) as T;
    } catch {
      /* a broken draft is ignored */
    }
    return initial();
  });
  const first = useRef(true);
  useEffect(() => {
    if (first.current) {
      first.current = false;
      if (localStorage.getItem(key)) setRestored(true);
      return;
    }
    try {
      localStorage.setItem(key, JSON.stringify(value));
    } catch {
      /* storage full or off: the form still works */
    }
  }, [key, value]);
  const clear = () => {
    localStorage.removeItem(key);
    setRestored(false);
  };
  return { value, setValue, restored, clear, dismiss: () => setRestored(false) };
}
