import { Badge } from '@mantine/core';
import { IconTrendingUp } from '@tabler/icons-react';

/** The drift flag of a run: shape and word as well as colour. */
export function DriftBadge({ size = 'md' }: { size?: 'sm' | 'md' | 'lg' }) {
  return (
    <Badge color="amber" variant="filled" size={size} leftSection={<IconTrendingUp size={14} />} data-testid="drift-flag">
      Drift
    </Badge>
  );
}
