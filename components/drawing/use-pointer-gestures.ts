// Native: the drawing pans and zooms with its buttons only (a scroll view around it keeps the page
// scrolling with one finger); the web version adds wheel and drag.
import type { RefObject } from 'react';

export function usePointerGestures(_ref: RefObject<unknown>, _on: { zoom: (factor: number, fx: number, fy: number) => void; pan: (dx: number, dy: number) => void }): void {}
