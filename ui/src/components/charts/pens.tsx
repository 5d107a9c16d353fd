/**
 * Chart pens from our palette: warm greys, copper and brass tints, each with its own dash pattern, so a chart reads in
 * greyscale and without a legend (every line carries its name at its last point). Amber and signal red are not pens:
 * they are kept for limits and alarms.
 */
export interface Pen {
  color: string;
  dash?: string;
}

export const PENS: Pen[] = [
  { color: 'copper.6' },
  { color: 'gray.6', dash: '8 4' },
  { color: 'brass.6', dash: '2 3' },
  { color: 'copper.3', dash: '10 3 2 3' },
  { color: 'gray.4', dash: '4 4' },
  { color: 'brass.4', dash: '12 4' },
  { color: 'copper.8', dash: '1 3' },
  { color: 'gray.8', dash: '6 2 2 2 2 2' },
];

export const pen = (i: number): Pen => PENS[i % PENS.length];

/** The CSS colour of a pen (a theme colour like `copper.6` becomes its Mantine variable). */
export const penCss = (color: string) => {
  const [name, shade] = color.split('.');
  return shade ? `var(--mantine-color-${name}-${shade})` : color;
};

/**
 * A recharts line label that writes the series' name beside its last point only (pass as `label` in `lineProps`).
 * `lastIndex` is the index of the row holding the line's last value.
 */
export function endLabel(name: string, lastIndex: number, color: string) {
  function EndLabel(props: { x?: number | string; y?: number | string; index?: number }) {
    if (props.index !== lastIndex || props.x === undefined || props.y === undefined) return null;
    return (
      <text x={Number(props.x) + 6} y={Number(props.y)} dy={4} fontSize={12} fontWeight={600} fill={penCss(color)} data-testid="line-label">
        {name}
      </text>
    );
  }
  return EndLabel;
}

/** Index of the last row where `key` has a number. */
export function lastIndexOf(rows: Record<string, unknown>[], key: string): number {
  for (let i = rows.length - 1; i >= 0; i--) if (typeof rows[i][key] === 'number') return i;
  return -1;
}
