// The visible window onto a drawing (a viewBox in drawing units) and the moves pan and zoom make
// on it; pure so both platforms' gesture code and the buttons share one behaviour.
export interface ViewBox { x: number; y: number; w: number; h: number }

export const ZOOM_STEP = 1.25;
/** Closest zoom: a window this many drawing units wide (a symbol or two). */
export const MIN_WIDTH = 60;

export function fitBox(width: number, height: number): ViewBox {
  return { x: 0, y: 0, w: Math.max(width, 1), h: Math.max(height, 1) };
}

/** Zooms by `factor` (>1 closer) keeping the drawing point at (fx, fy) — fractions of the window — still. */
export function zoomBy(v: ViewBox, factor: number, fx = 0.5, fy = 0.5, limit?: ViewBox): ViewBox {
  let w = v.w / factor;
  let h = v.h / factor;
  if (w < MIN_WIDTH) {
    h *= MIN_WIDTH / w;
    w = MIN_WIDTH;
  }
  // Never further out than four times the whole drawing.
  if (limit && w > limit.w * 4) {
    h *= (limit.w * 4) / w;
    w = limit.w * 4;
  }
  return { x: v.x + (v.w - w) * fx, y: v.y + (v.h - h) * fy, w, h };
}

/** Pans by a drag of (dx, dy) screen pixels on a window `screenW` pixels wide. */
export function panBy(v: ViewBox, dx: number, dy: number, screenW: number, screenH: number): ViewBox {
  // preserveAspectRatio "meet": one scale for both axes, the larger ratio wins.
  const k = Math.max(v.w / Math.max(screenW, 1), v.h / Math.max(screenH, 1));
  return { ...v, x: v.x - dx * k, y: v.y - dy * k };
}

export const viewBoxString = (v: ViewBox) => `${v.x} ${v.y} ${v.w} ${v.h}`;
