// The region a proposal changes, as graphs to draw and waveforms to compare: one public surface.
export * from './graph';
export * from './region';
export * from './stimulus';
export * from './simulate';
