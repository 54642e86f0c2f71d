/**
 * Deferred mounting, so the first screen paints before what it does not need at once.
 * `AfterFirstPaint` shows its children one frame after it mounts (the page's first paint has
 * happened by then; in a background tab, which gets no frames, after a second); `WhenNearView` shows them once their place comes near the viewport, the
 * browser is idle, or the page is printed — whichever is first — so they are always there a
 * moment after the page settles (for print, screenshots and anyone who does not scroll).
 * Where the browser lacks what they wait for (requestAnimationFrame, IntersectionObserver) the
 * children show at once.
 */
import { useEffect, useRef, useState, type ReactNode } from 'react';
import { flushSync } from 'react-dom';

/** How far outside the viewport a deferred part starts mounting, so it is ready when scrolled to. */
const NEAR_VIEW_MARGIN = '300px 0px';
/** How long a deferred part waits for a frame that does not come (a background tab). */
const BACKGROUND_FALLBACK_MS = 1000;
/** The longest an idle wait lasts before a deferred part mounts anyway. */
const IDLE_TIMEOUT_MS = 1500;

/** `skip` shows the children at once (for a caller that defers only in some places). */
export function AfterFirstPaint({ children, placeholder = null, skip = false }: { children: ReactNode; placeholder?: ReactNode; skip?: boolean }) {
  const [shown, setShown] = useState(() => skip || typeof requestAnimationFrame !== 'function');
  useEffect(() => {
    if (shown) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    // The frame callback runs just before the paint; the timer after it.
    const frame = requestAnimationFrame(() => {
      timer = setTimeout(() => setShown(true), 0);
    });
    // A page opened in a background tab gets no frames until it is shown; the children come anyway.
    const fallback = setTimeout(() => setShown(true), BACKGROUND_FALLBACK_MS);
    return () => {
      cancelAnimationFrame(frame);
      clearTimeout(timer);
      clearTimeout(fallback);
    };
  }, [shown]);
  return shown ? children : placeholder;
}

export function WhenNearView({ children, placeholder }: { children: ReactNode; placeholder: ReactNode }) {
  const [shown, setShown] = useState(() => typeof IntersectionObserver !== 'function');
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const element = box.current;
    if (shown || !element) return;
    const show = () => setShown(true);
    const observer = new IntersectionObserver((entries) => entries.some((entry) => entry.isIntersecting) && show(), { rootMargin: NEAR_VIEW_MARGIN });
    observer.observe(element);
    const idle = typeof requestIdleCallback === 'function' ? requestIdleCallback(show, { timeout: IDLE_TIMEOUT_MS }) : undefined;
    const timer = idle === undefined ? setTimeout(show, IDLE_TIMEOUT_MS) : undefined;
    // Printing does not wait: the part mounts before the print is laid out.
    const print = () => flushSync(show);
    window.addEventListener('beforeprint', print);
    return () => {
      observer.disconnect();
      if (idle !== undefined) cancelIdleCallback(idle);
      clearTimeout(timer);
      window.removeEventListener('beforeprint', print);
    };
  }, [shown]);
  return shown ? children : <div ref={box}>{placeholder}</div>;
}
