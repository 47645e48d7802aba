// Web: wheel zooms about the pointer, drag (mouse or pen or one finger) pans. Listeners go on the
// DOM node directly because react-native-web does not forward wheel events.
import { useEffect, useRef, type RefObject } from 'react';

export function usePointerGestures(ref: RefObject<unknown>, on: { zoom: (factor: number, fx: number, fy: number) => void; pan: (dx: number, dy: number) => void }): void {
  const handlers = useRef(on);
  handlers.current = on;
  useEffect(() => {
    const el = ref.current as HTMLElement | null;
    if (!el || typeof el.addEventListener !== 'function') return;
    let last: { x: number; y: number; id: number } | null = null;
    const wheel = (e: WheelEvent) => {
      e.preventDefault();
      const r = el.getBoundingClientRect();
      handlers.current.zoom(e.deltaY < 0 ? 1.15 : 1 / 1.15, (e.clientX - r.left) / Math.max(r.width, 1), (e.clientY - r.top) / Math.max(r.height, 1));
    };
    const down = (e: PointerEvent) => {
      last = { x: e.clientX, y: e.clientY, id: e.pointerId };
      el.setPointerCapture?.(e.pointerId);
    };
    const move = (e: PointerEvent) => {
      if (!last || last.id !== e.pointerId) return;
      handlers.current.pan(e.clientX - last.x, e.clientY - last.y);
      last = { x: e.clientX, y: e.clientY, id: e.pointerId };
    };
    const up = () => {
      last = null;
    };
    el.addEventListener('wheel', wheel, { passive: false });
    el.addEventListener('pointerdown', down);
    el.addEventListener('pointermove', move);
    el.addEventListener('pointerup', up);
    el.addEventListener('pointercancel', up);
    el.style.touchAction = 'none';
    el.style.cursor = 'grab';
    return () => {
      el.removeEventListener('wheel', wheel);
      el.removeEventListener('pointerdown', down);
      el.removeEventListener('pointermove', move);
      el.removeEventListener('pointerup', up);
      el.removeEventListener('pointercancel', up);
    };
  }, [ref]);
}
