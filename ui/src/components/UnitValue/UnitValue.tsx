import { Group, Text } from '@mantine/core';
import { useUnits } from '../../features/units/useUnits';
import { formatNumber, unitLabel } from '../../features/units/units';

const SIZES = { xs: { n: 15, u: 12 }, sm: { n: 17, u: 13 }, md: { n: 22, u: 14 }, lg: { n: 30, u: 16 }, xl: { n: 44, u: 20 } } as const;

export interface UnitValueProps {
  value: number | null | undefined;
  /** The unit the value is stored in (e.g. "degF"); shown converted to the person's unit system. */
  unit: string;
  size?: keyof typeof SIZES;
  decimals?: number;
  /** A difference or rate: the conversion's offset does not apply. */
  delta?: boolean;
  /** Show the stored value as is, without conversion. */
  raw?: boolean;
  /** Printed after the unit, e.g. "/min". */
  per?: string;
  c?: string;
}

/** A number with tabular figures and its unit beside it, in the person's unit system. */
export function UnitValue({ value, unit, size = 'md', decimals, delta, raw, per, c }: UnitValueProps) {
  const { display } = useUnits();
  const d = raw
    ? (() => {
        const text = value === null || value === undefined ? '—' : formatNumber(value, decimals ?? 0);
        return { text, unitLabel: unitLabel(unit), label: `${text} ${unitLabel(unit)}`, converted: false };
      })()
    : display(value, unit, { decimals, delta });
  const s = SIZES[size];
  const recorded =
    d.converted && value !== null && value !== undefined
      ? `Recorded as ${formatNumber(value, decimals ?? 2)} ${unitLabel(unit)}`
      : undefined;
  return (
    <Group component="span" gap={4} wrap="nowrap" align="baseline" display="inline-flex" title={recorded} data-testid="unit-value">
      <Text component="span" className="cj-num" fz={s.n} fw={600} lh={1.1} c={c}>
        {d.text}
      </Text>
      <Text component="span" fz={s.u} c="dimmed" lh={1.1}>
        {d.unitLabel}
        {per}
      </Text>
    </Group>
  );
}
