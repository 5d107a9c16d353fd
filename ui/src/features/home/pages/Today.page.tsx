import { Card, Group, SimpleGrid, Stack, Text, ThemeIcon } from '@mantine/core';
import { Link } from 'react-router-dom';
import { IconShieldCheck } from '@tabler/icons-react';
import { ROLE_LABELS } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { Caution, SAFETY_NOTE } from '../../../components/Caution/Caution';
import { useSession } from '../../auth/useSession';
import { navigationFor } from '../../../components/AppShell/navigation';
import { todayPanels } from '../components/today-panels';

/** The start screen: what needs this person today. Feature areas add their panels in today-panels.tsx. */
export default function TodayPage() {
  const session = useSession()!;
  const role = session.user.role;
  const panels = todayPanels.filter((p) => p.roles.includes(role));
  const shortcuts = navigationFor(role)
    .flatMap((g) => g.items)
    .filter((i) => i.path !== '/');
  return (
    <Stack>
      <PageHeader
        title={`Good day, ${session.user.displayName.split(' ')[0]}`}
        subtitle={`${ROLE_LABELS[role]} · ${new Date().toLocaleDateString(undefined, { weekday: 'long', day: 'numeric', month: 'long' })}`}
      />
      {panels.map((P) => (
        <P.Component key={P.key} />
      ))}
      <SimpleGrid cols={{ base: 1, sm: 2, lg: 3 }}>
        {shortcuts.map((i) => (
          <Card key={i.path} component={Link} to={i.path} withBorder padding="lg" style={{ minHeight: 88 }}>
            <Group>
              <ThemeIcon variant="light" size={44}>
                <i.icon size={26} />
              </ThemeIcon>
              <Text fw={600} fz="lg">
                {i.label}
              </Text>
            </Group>
          </Card>
        ))}
      </SimpleGrid>
      <Caution title="Safety">
        <Group gap="xs" wrap="nowrap" align="flex-start">
          <IconShieldCheck size={20} />
          <Text fz="sm">{SAFETY_NOTE}</Text>
        </Group>
      </Caution>
    </Stack>
  );
}
