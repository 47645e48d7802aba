// Proves the slider primitive: values snap to the step inside the range, arrow keys and Home/End
// move it, and it is exposed to assistive technology as a slider with its value in words.
import { useState } from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { Slider, snapToStep } from './slider';

afterEach(cleanup);

function Harness() {
  const [v, setV] = useState(10);
  return <Slider label="Pull-up value" value={v} min={0} max={20} step={2} onChange={setV} format={(x) => `${x} Ω`} testID="s" />;
}

describe('snapToStep', () => {
  it('clamps to the range and snaps to the nearest step', () => {
    expect(snapToStep(7.1, 0, 20, 2)).toBe(8);
    expect(snapToStep(-3, 0, 20, 2)).toBe(0);
    expect(snapToStep(99, 0, 20, 2)).toBe(20);
    // Float steps come back without rounding noise.
    expect(snapToStep(0.3, 0, 1, 0.1)).toBe(0.3);
  });
});

describe('Slider', () => {
  it('moves with the arrow keys and jumps with Home and End', () => {
    render(<Harness />);
    const track = screen.getByTestId('s');
    expect(track.getAttribute('role')).toBe('slider');
    fireEvent.keyDown(track, { key: 'ArrowRight' });
    expect(screen.getByTestId('s-value').textContent).toBe('12 Ω');
    fireEvent.keyDown(track, { key: 'ArrowLeft' });
    fireEvent.keyDown(track, { key: 'ArrowDown' });
    expect(screen.getByTestId('s-value').textContent).toBe('8 Ω');
    fireEvent.keyDown(track, { key: 'End' });
    expect(screen.getByTestId('s-value').textContent).toBe('20 Ω');
    fireEvent.keyDown(track, { key: 'ArrowUp' });
    expect(screen.getByTestId('s-value').textContent).toBe('20 Ω');
    fireEvent.keyDown(track, { key: 'Home' });
    expect(screen.getByTestId('s-value').textContent).toBe('0 Ω');
    expect(track.getAttribute('aria-valuetext')).toBe('0 Ω');
  });
});
