import { Group, Text } from '@mantine/core';

/** Our mark: a crank and its throw, drawn as a wheel with a brass arm. */
export function Brand({ size = 28 }: { size?: number }) {
  return (
    <Group gap={8} wrap="nowrap">
      <svg width={size} height={size} viewBox="0 0 64 64" aria-hidden>
        <rect width="64" height="64" rx="12" fill="var(--mantine-color-copper-7)" />
        <circle cx="24" cy="32" r="14" fill="none" stroke="#e9dcb5" strokeWidth="5" />
        <circle cx="24" cy="32" r="3" fill="#e9dcb5" />
        <path d="M24 32 L52 22" stroke="#c9a24a" strokeWidth="5" strokeLinecap="round" />
      </svg>
      <Text fw={700} fz="lg" style={{ letterSpacing: 0.3 }}>
        Crankjournal
      </Text>
    </Group>
  );
}
