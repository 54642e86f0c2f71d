// @vitest-environment jsdom
/**
 * Deferred mounting on the proposal page: a part behind `AfterFirstPaint` mounts one frame after
 * its parent (the first paint has happened by then), or after a second in a background tab; a plot behind `WhenNearView` mounts when its
 * place comes near the viewport, when the browser is idle, or when the page is printed, whichever
 * is first, and a browser without IntersectionObserver shows it at once.
 */
import { act, cleanup, render, screen } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, test, vi } from 'vitest';
import { AfterFirstPaint, WhenNearView } from '../../../web/src/components/ui/deferred';

afterEach(() => {
  cleanup();
  vi.unstubAllGlobals();
});

describe('AfterFirstPaint', () => {
  test('the children follow one frame after the rest, the placeholder holds the place until then', async () => {
    const frames: FrameRequestCallback[] = [];
    vi.stubGlobal('requestAnimationFrame', (callback: FrameRequestCallback) => frames.push(callback));
    render(
      <>
        <p>table</p>
        <AfterFirstPaint placeholder={<p>waiting</p>}>
          <p>detail</p>
        </AfterFirstPaint>
      </>,
    );
    expect(screen.getByText('table')).toBeTruthy();
    expect(screen.getByText('waiting')).toBeTruthy();
    expect(screen.queryByText('detail')).toBeNull();
    expect(frames).toHaveLength(1);
    act(() => frames[0](0));
    // Not inside the frame callback (that runs before the paint), but in the task after it.
    expect(screen.queryByText('detail')).toBeNull();
    expect(await screen.findByText('detail')).toBeTruthy();
    expect(screen.queryByText('waiting')).toBeNull();
  });

  test('in a background tab (no frames) the children come after a second anyway', () => {
    vi.useFakeTimers();
    try {
      vi.stubGlobal('requestAnimationFrame', () => 1);
      vi.stubGlobal('cancelAnimationFrame', () => undefined);
      render(
        <AfterFirstPaint>
          <p>detail</p>
        </AfterFirstPaint>,
      );
      act(() => vi.advanceTimersByTime(900));
      expect(screen.queryByText('detail')).toBeNull();
      act(() => vi.advanceTimersByTime(200));
      expect(screen.getByText('detail')).toBeTruthy();
    } finally {
      vi.useRealTimers();
    }
  });

  test('skip shows the children at once', () => {
    vi.stubGlobal('requestAnimationFrame', () => 0);
    render(
      <AfterFirstPaint skip>
        <p>detail</p>
      </AfterFirstPaint>,
    );
    expect(screen.getByText('detail')).toBeTruthy();
  });
});

describe('WhenNearView', () => {
  let observers: { callback: IntersectionObserverCallback; targets: Element[]; options?: IntersectionObserverInit; disconnected: boolean }[];
  let idle: IdleRequestCallback[];
  beforeEach(() => {
    observers = [];
    idle = [];
    vi.stubGlobal(
      'IntersectionObserver',
      class {
        entry: (typeof observers)[number];
        constructor(callback: IntersectionObserverCallback, options?: IntersectionObserverInit) {
          this.entry = { callback, targets: [], options, disconnected: false };
          observers.push(this.entry);
        }
        observe(target: Element) {
          this.entry.targets.push(target);
        }
        disconnect() {
          this.entry.disconnected = true;
        }
      },
    );
    vi.stubGlobal('requestIdleCallback', (callback: IdleRequestCallback) => idle.push(callback));
    vi.stubGlobal('cancelIdleCallback', () => undefined);
  });

  const renderPlot = () =>
    render(
      <WhenNearView placeholder={<p>Drawing the plot…</p>}>
        <p>plot</p>
      </WhenNearView>,
    );
  const report = (isIntersecting: boolean) =>
    act(() => observers[0].callback([{ isIntersecting, target: observers[0].targets[0] } as IntersectionObserverEntry], {} as IntersectionObserver));

  test('waits off screen, mounts when its place comes near the viewport, and stops watching', () => {
    renderPlot();
    expect(screen.getByText('Drawing the plot…')).toBeTruthy();
    expect(screen.queryByText('plot')).toBeNull();
    expect(observers).toHaveLength(1);
    expect(observers[0].targets[0].textContent).toBe('Drawing the plot…');
    expect(observers[0].options?.rootMargin).toMatch(/px/);
    report(false);
    expect(screen.queryByText('plot')).toBeNull();
    report(true);
    expect(screen.getByText('plot')).toBeTruthy();
    expect(observers[0].disconnected).toBe(true);
  });

  test('mounts when the browser is idle, even if never scrolled to', () => {
    renderPlot();
    expect(idle).toHaveLength(1);
    act(() => idle[0]({ didTimeout: false, timeRemaining: () => 10 }));
    expect(screen.getByText('plot')).toBeTruthy();
  });

  test('mounts before a print is laid out', () => {
    renderPlot();
    act(() => {
      window.dispatchEvent(new Event('beforeprint'));
    });
    expect(screen.getByText('plot')).toBeTruthy();
  });

  test('without IntersectionObserver the plot shows at once', () => {
    vi.stubGlobal('IntersectionObserver', undefined);
    renderPlot();
    expect(screen.getByText('plot')).toBeTruthy();
    expect(screen.queryByText('Drawing the plot…')).toBeNull();
  });
});
