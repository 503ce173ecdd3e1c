// The form's clock: the time shown while it follows the clock, refreshed every 30 s and on demand.
import { useCallback, useEffect, useState } from 'preact/hooks';

/**
 * The clock (UTC ms) for showing "now" and for the live checks; `tick` reads it again at once (after a save,
 * so the next reading's checks see the one just stored). A reading is stamped with the instant of Save,
 * never with this value, which may be up to 30 s old (DOMAIN.md §1).
 */
export function useClock(): { now: number; tick: () => void } {
  const [now, setNow] = useState(Date.now());
  useEffect(() => {
    const t = setInterval(() => setNow(Date.now()), 30_000);
    return () => clearInterval(t);
  }, []);
  const tick = useCallback(() => setNow(Date.now()), []);
  return { now, tick };
}
