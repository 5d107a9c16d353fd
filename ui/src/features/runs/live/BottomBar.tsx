import type { ReactNode } from 'react';
import { Box, Group } from '@mantine/core';

export const BOTTOM_BAR_HEIGHT = 84;

/** The tablet's fixed bar with the few actions of the moment; the page keeps room for it at its foot. */
export function BottomBar({ children, label = 'Actions' }: { children: ReactNode; label?: string }) {
  return (
    <>
      <Box h={BOTTOM_BAR_HEIGHT + 16} aria-hidden />
      <Box
        component="nav"
        aria-label={label}
        px="md"
        py="sm"
        style={{
          position: 'fixed',
          bottom: 0,
          left: 'var(--app-shell-navbar-offset, 0rem)',
          right: 0,
          minHeight: BOTTOM_BAR_HEIGHT,
          zIndex: 150,
          background: 'var(--mantine-color-body)',
          borderTop: '1px solid var(--mantine-color-default-border)',
          boxShadow: '0 -4px 12px rgba(0,0,0,.12)',
          display: 'flex',
          alignItems: 'center',
        }}
      >
        <Group gap="sm" w="100%" wrap="nowrap" justify="space-between">
          {children}
        </Group>
      </Box>
    </>
  );
}
