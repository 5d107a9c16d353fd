import { Link } from 'react-router-dom';
import { Anchor, Stack, Text } from '@mantine/core';

/** A lot's reference, linked to its page, over its customer's name: the first cell of every list of lots. */
export function LotReference({ lotId, reference, customerName }: { lotId: string; reference: string; customerName: string }) {
  return (
    <Stack gap={0}>
      <Anchor component={Link} to={`/mill/lots/${lotId}`} fw={600} fz="lg">
        {reference}
      </Anchor>
      <Text fz="sm" c="dimmed">
        {customerName}
      </Text>
    </Stack>
  );
}
