import { Suspense, useEffect, useState } from 'react';
import { NavLink as RouterLink, Outlet, useLocation, useNavigate } from 'react-router-dom';
import {
  ActionIcon,
  AppShell,
  Badge,
  Burger,
  Center,
  Group,
  Loader,
  ScrollArea,
  Stack,
  Text,
  Tooltip,
  useComputedColorScheme,
  useMantineColorScheme,
} from '@mantine/core';
import { useDisclosure } from '@mantine/hooks';
import { notifications } from '@mantine/notifications';
import { IconLogout, IconMoon, IconSun } from '@tabler/icons-react';
import { ROLE_LABELS } from '@crankjournal/shared-types';
import { Brand } from '../Brand';
import { useSession } from '../../features/auth/useSession';
import { signOut } from '../../features/auth/api/auth.api';
import { getSocket } from '../../api/socket';
import { OfflineBanner } from '../Offline/OfflineBanner';
import { OutboxIndicator, useOutboxRunner } from '../Offline/OutboxIndicator';
import { navigationFor, shortLabel } from './navigation';

export function Shell() {
  const session = useSession()!;
  const [opened, { toggle, close }] = useDisclosure();
  const navigate = useNavigate();
  const location = useLocation();
  const { setColorScheme } = useMantineColorScheme();
  const scheme = useComputedColorScheme('dark');
  const [live, setLive] = useState<boolean>(false);

  useEffect(close, [location.pathname, close]);
  useOutboxRunner(session.accessToken);
  useEffect(() => {
    const s = getSocket();
    if (!s) return;
    const on = () => setLive(true);
    const off = () => setLive(false);
    const notice = (n: { message: string; from: string }) =>
      notifications.show({ title: `Notice from ${n.from}`, message: n.message, autoClose: 15_000 });
    s.on('connect', on);
    s.on('disconnect', off);
    s.on('site:notice', notice);
    setLive(s.connected);
    return () => {
      s.off('connect', on);
      s.off('disconnect', off);
      s.off('site:notice', notice);
    };
  }, [session.accessToken]);

  const groups = navigationFor(session.user.role);
  return (
    <AppShell header={{ height: 48 }} navbar={{ width: 92, breakpoint: 'md', collapsed: { mobile: !opened } }} padding="md">
      <AppShell.Header>
        <Group h="100%" px="md" justify="space-between" wrap="nowrap">
          <Group wrap="nowrap">
            <Burger opened={opened} onClick={toggle} hiddenFrom="md" size="md" aria-label="Open navigation" />
            <Brand size={24} />
          </Group>
          <Group gap="xs" wrap="nowrap">
            <OutboxIndicator />
            <Tooltip label={live ? 'Readings and alarms arrive as they happen' : 'Reload a page to see new readings and alarms'}>
              <Badge variant="outline" color={live ? 'gray' : 'amber'} size="lg" visibleFrom="sm" data-testid="live-state">
                {live ? 'Live updates on' : 'Live updates off'}
              </Badge>
            </Tooltip>
            <Stack gap={0} visibleFrom="sm" align="flex-end">
              <Text fz="sm" fw={600} data-testid="signed-in-name">
                {session.user.displayName}
              </Text>
              <Text fz="xs" c="dimmed" data-testid="signed-in-role">
                {ROLE_LABELS[session.user.role]}
              </Text>
            </Stack>
            <ActionIcon
              variant="subtle"
              color="gray"
              aria-label={scheme === 'dark' ? 'Use the light scheme' : 'Use the dark scheme'}
              onClick={() => setColorScheme(scheme === 'dark' ? 'light' : 'dark')}
            >
              {scheme === 'dark' ? <IconSun /> : <IconMoon />}
            </ActionIcon>
            <ActionIcon
              variant="subtle"
              color="gray"
              aria-label="Sign out"
              onClick={async () => {
                await signOut();
                void navigate('/sign-in', { replace: true });
              }}
            >
              <IconLogout />
            </ActionIcon>
          </Group>
        </Group>
      </AppShell.Header>
      <AppShell.Navbar aria-label="Main navigation" className="cj-rail">
        <ScrollArea scrollbarSize={6}>
          <div>
            {groups.map((g) => (
              <div key={g.label} className="cj-rail-group" role="group" aria-label={g.label}>
                {g.items.length > 1 && (
                  <Text className="cj-rail-heading" aria-hidden>
                    {g.label}
                  </Text>
                )}
                {g.items.map((i) => (
                  <RouterLink key={i.path} to={i.path} end={i.path === '/'} className="cj-rail-item" aria-label={i.label} title={i.label}>
                    <i.icon size={24} stroke={1.6} />
                    <span className="cj-rail-label">{shortLabel(i)}</span>
                  </RouterLink>
                ))}
              </div>
            ))}
          </div>
        </ScrollArea>
      </AppShell.Navbar>
      <AppShell.Main>
        <OfflineBanner />
        <Suspense
          fallback={
            <Center h={200}>
              <Loader />
            </Center>
          }
        >
          <Outlet />
        </Suspense>
      </AppShell.Main>
    </AppShell>
  );
}
