import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Card, Group, List, Loader, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import { IconPencil } from '@tabler/icons-react';
import { MILL_WRITERS } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { Caution } from '../../../components/Caution/Caution';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { scheduleQuery } from '../api/mill.api';
import { fmt, product, sectionLong } from '../model/format';
import { MILL_CAUTION } from '../model/caution';
import { PassCalcTable } from '../components/PassCalcTable';
import { PlanFromTemplate } from '../components/PlanFromTemplate';

/** /mill/schedules/:id — a schedule or template with every pass worked out. */
export default function ScheduleDetailPage() {
  const { id = '' } = useParams();
  const canWrite = useHasRole(...MILL_WRITERS);
  const { data: s, isLoading, error } = useQuery(scheduleQuery(id));
  if (isLoading) return <Loader />;
  if (error || !s) return <Alert color="signal">{errorText(error)}</Alert>;
  return (
    <Stack gap="lg">
      <PageHeader
        title={s.name}
        subtitle={`${product(s)} · ${s.steelGrade}${/% C/.test(s.steelGrade) ? '' : ` (${fmt(s.carbonPct, 2)} % C)`} · ${s.millName}`}
        state={
          <Group gap="xs">
            {s.isTemplate ? (
              <Badge size="lg" variant="outline">
                Template
              </Badge>
            ) : (
              <Badge size="lg" variant="light" color="gray">
                Working schedule
              </Badge>
            )}
            {s.archived && <Badge color="gray">Archived</Badge>}
          </Group>
        }
        action={
          canWrite && (
            <Group>
              <Button component={Link} to={`/mill/schedules/${s.id}/edit`} variant="default" leftSection={<IconPencil />}>
                Edit schedule
              </Button>
              {s.isTemplate && <PlanFromTemplate templateId={s.id} />}
            </Group>
          )
        }
      />
      <Card withBorder padding="lg">
        <SimpleGrid cols={{ base: 1, sm: 2, lg: 4 }} spacing="md">
          <Stack gap={2}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              Stock
            </Text>
            <Text className="cj-num">
              {sectionLong(s.stock)}, {fmt(s.stockLengthMm, 0)} mm long
            </Text>
          </Stack>
          <Stack gap={2}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              Total elongation
            </Text>
            <Text className="cj-num">
              ×{fmt(s.totalElongation, 2)} → bar {fmt(s.finalLengthM, 2)} m long
            </Text>
          </Stack>
          <Stack gap={2}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              Planned from
            </Text>
            <Text>
              {s.templateId ? (
                <Anchor component={Link} to={`/mill/schedules/${s.templateId}`}>
                  {s.templateName}
                </Anchor>
              ) : (
                '—'
              )}
            </Text>
          </Stack>
          <Stack gap={2}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              Customer lot
            </Text>
            <Text>
              {s.lotId ? (
                <Anchor component={Link} to={`/mill/lots/${s.lotId}`}>
                  {s.lotReference}
                </Anchor>
              ) : (
                '—'
              )}
            </Text>
          </Stack>
        </SimpleGrid>
        {s.notes && (
          <Text mt="md" style={{ whiteSpace: 'pre-wrap' }}>
            {s.notes}
          </Text>
        )}
      </Card>
      {s.flaggedPasses > 0 && (
        <Alert color="signal" variant="light" title={`${s.flaggedPasses} pass(es) flagged`} role="alert">
          Look at the flagged passes below before rolling: lighten the draft, roll hotter, or move the pass to a stronger stand.
        </Alert>
      )}
      <Title order={2} fz="xl">
        Passes
      </Title>
      <PassCalcTable
        caption="Passes of the schedule"
        rows={s.passes.map((p) => ({
          key: p.id,
          passNumber: p.seq,
          standName: p.standName,
          entry: p.entry,
          exit: p.exit,
          temperatureC: p.expectedTemperatureC,
          temperatureWord: 'expected',
          calc: p.calc,
          calcError: p.calcError,
          notes: p.notes,
        }))}
      />
      <Card withBorder padding="md">
        <Text fw={600} mb={4}>
          What the plan assumes
        </Text>
        <List size="sm" spacing={2}>
          {s.assumptions.map((a) => (
            <List.Item key={a}>{a}</List.Item>
          ))}
        </List>
      </Card>
      <Caution title="Hot steel and heavy rolls">{MILL_CAUTION}</Caution>
    </Stack>
  );
}
