import { useEffect, useState } from 'react';

/**
 * Server time now, redrawn every 100 ms: the client's clock plus the measured offset. Ten redraws a second keep
 * the seconds digit on time without tying the page to every animation frame.
 */
export function useServerNow(offset: number, everyMs = 100): number {
  const [now, setNow] = useState(() => Date.now() + offset);
  useEffect(() => {
    setNow(Date.now() + offset);
    const id = setInterval(() => setNow(Date.now() + offset), everyMs);
    return () => clearInterval(id);
  }, [offset, everyMs]);
  return now;
}
