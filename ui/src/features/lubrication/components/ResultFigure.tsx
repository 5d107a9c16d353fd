import { Stack, Text } from '@mantine/core';
import { formatNumber } from '../../units/units';

export const fmtN = (v: number | null | undefined, decimals = 1) =>
  v === null || v === undefined || !Number.isFinite(v) ? '—' : formatNumber(v, decimals);
/** Small or large numbers in scientific form (viscosity in reyn, Sommerfeld numbers). */
export const fmtSci = (v: number | null | undefined, digits = 3) =>
  v === null || v === undefined || !Number.isFinite(v)
    ? '—'
    : Math.abs(v) >= 0.01 && Math.abs(v) < 1e5
      ? formatNumber(v, digits)
      : v.toExponential(digits - 1);

/** A result: its name above, the number large with its unit beside it. */
export function ResultFigure({ label, value, unit, testId }: { label: string; value: string; unit?: string; testId?: string }) {
  return (
    <Stack gap={0}>
      <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
        {label}
      </Text>
      <Text fz={26} fw={700} className="cj-num" data-testid={testId}>
        {value}
        {unit && (
          <Text span fz="md" c="dimmed" fw={400}>
            {' '}
            {unit}
          </Text>
        )}
      </Text>
    </Stack>
  );
}
