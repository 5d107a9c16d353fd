import type { ReactNode } from 'react';
import { Group, Stack, Text, Title } from '@mantine/core';

/** The page's title, its state and (right) its one primary action. */
export function PageHeader({
  title,
  subtitle,
  state,
  action,
}: {
  title: string;
  subtitle?: ReactNode;
  state?: ReactNode;
  action?: ReactNode;
}) {
  return (
    <Group justify="space-between" align="flex-start" mb="lg" wrap="wrap">
      <Stack gap={2}>
        <Group gap="sm">
          <Title order={1} fz={28}>
            {title}
          </Title>
          {state}
        </Group>
        {subtitle && (
          <Text c="dimmed" fz="sm">
            {subtitle}
          </Text>
        )}
      </Stack>
      {action}
    </Group>
  );
}
