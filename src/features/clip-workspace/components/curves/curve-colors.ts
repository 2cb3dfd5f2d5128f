// Line colours for the curves: the project palette's strongest tones, in an order where neighbours
// differ in hue and lightness, plus dashes so lines stay apart when printed in grey.
export const SERIES_STYLES = [
  { stroke: '#245178', dash: undefined },
  { stroke: '#c47610', dash: undefined },
  { stroke: '#177457', dash: undefined },
  { stroke: '#4f5968', dash: '6 3' },
  { stroke: '#5e9cc7', dash: '6 3' },
  { stroke: '#9c5a10', dash: '2 3' },
  { stroke: '#3fae8a', dash: '2 3' },
  { stroke: '#1a1f27', dash: '8 3 2 3' },
] as const;

export const TURN_FILL = { left: '#94bfdc', right: '#f5b443' } as const;
export const TURN_FILL_OPACITY = { left: 0.28, right: 0.22 } as const;
export const FLAG_COLOR = '#b83422';
/** The same moments for athletes and guardians: a target to work toward, not an alarm. */
export const TARGET_COLOR = '#1f6f9f';
export const CURSOR_COLOR = '#11243a';
