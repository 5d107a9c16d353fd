import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Card, Group, Loader, Stack, Text, Title } from '@mantine/core';
import { IconClipboardPlus, IconPlus, IconTool } from '@tabler/icons-react';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { dueListQuery } from '../api/maintenance.api';
import { DueList } from '../components/DueList';

/** /maintenance — every active inspection plan with what is due, overrun first. */
export default function MaintenanceOverviewPage() {
  const canWrite = useHasRole('maintenance_lead', 'chief_engineer');
  const { data, isLoading, error } = useQuery(dueListQuery());
  const overrun = data?.items.filter((p) => p.due.status === 'overrun').length ?? 0;
  const soon = data?.items.filter((p) => p.due.status === 'coming_due').length ?? 0;
  return (
    <Stack gap="lg">
      <PageHeader
        title="Due and plans"
        subtitle={data ? `${overrun} overrun · ${soon} coming due · ${data.items.length} plans` : undefined}
        action={
          canWrite && (
            <Group gap="sm">
              <Button component={Link} to="/maintenance/work/new" variant="default" leftSection={<IconTool size={18} />}>
                Record work
              </Button>
              <Button component={Link} to="/maintenance/inspections/new" variant="default" leftSection={<IconClipboardPlus size={18} />}>
                Record an inspection
              </Button>
              <Button component={Link} to="/maintenance/plans/new" leftSection={<IconPlus size={18} />}>
                Plan an inspection
              </Button>
            </Group>
          )
        }
      />
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && (
        <Card withBorder padding="lg" radius="md">
          <Stack gap="sm">
            <Title order={2} fz={22}>
              Plans
            </Title>
            {data.items.length === 0 ? <Text c="dimmed">No inspection is planned yet.</Text> : <DueList plans={data.items} showEngine />}
            <Text fz="sm" c="dimmed">
              {data.ruleText} Estimated dates for hours and revolutions assume the engine keeps up its running of the past year.
            </Text>
          </Stack>
        </Card>
      )}
    </Stack>
  );
}
