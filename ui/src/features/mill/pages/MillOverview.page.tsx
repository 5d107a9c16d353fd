import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Button, Card, Grid, Group, Loader, SimpleGrid, Stack, Table, Text, Title } from '@mantine/core';
import { IconCalculator, IconClipboardList, IconPencil, IconPlus, IconTimeline, IconTruckDelivery } from '@tabler/icons-react';
import { MILL_WRITERS, type MillDto } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { Caution } from '../../../components/Caution/Caution';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { millsQuery } from '../api/mill.api';
import { fmt, inchesText, money, pct } from '../model/format';
import { MILL_CAUTION } from '../model/caution';

function Setting({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Stack gap={2}>
      <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
        {label}
      </Text>
      <Text className="cj-num" fz="lg" fw={600}>
        {children}
      </Text>
    </Stack>
  );
}

/** /mill: the mill described per site — stands, driving engine, the pass-check settings and the quote rates. */
export default function MillOverviewPage() {
  const canWrite = useHasRole(...MILL_WRITERS);
  const { data, isLoading, error } = useQuery(millsQuery());
  if (isLoading) return <Loader />;
  if (error || !data) return <Alert color="signal">{errorText(error)}</Alert>;
  return (
    <Stack gap="lg">
      <PageHeader
        title="Mill"
        subtitle="The bar mill the engine drives: its stands, the settings the pass checks use, and the rates quotes are made from."
        action={
          canWrite && (
            <Button
              component={Link}
              to="/mill/mills/new"
              variant={data.length ? 'default' : 'filled'}
              size={data.length ? 'md' : 'lg'}
              leftSection={<IconPlus />}
            >
              Describe a mill
            </Button>
          )
        }
      />
      <SimpleGrid cols={{ base: 1, sm: 2, lg: 4 }} spacing="md">
        <Button component={Link} to="/mill/schedules" variant="light" size="lg" leftSection={<IconClipboardList />}>
          Pass schedules
        </Button>
        <Button component={Link} to="/mill/rolling" variant="light" size="lg" leftSection={<IconTimeline />}>
          Rolling log
        </Button>
        <Button component={Link} to="/mill/lots" variant="light" size="lg" leftSection={<IconTruckDelivery />}>
          Customer lots
        </Button>
        <Button component={Link} to="/calculators/rolling-pass" variant="light" size="lg" leftSection={<IconCalculator />}>
          Pass calculator
        </Button>
      </SimpleGrid>
      {data.length === 0 && (
        <Alert color="gray">No mill is described yet.{canWrite ? ' Describe the mill and the engine that drives it.' : ''}</Alert>
      )}
      {data.map((m) => (
        <MillCard key={m.id} mill={m} canWrite={canWrite} />
      ))}
    </Stack>
  );
}

function MillCard({ mill, canWrite }: { mill: MillDto; canWrite: boolean }) {
  const r = mill.quoteRates;
  const s = mill.settings;
  return (
    <Card withBorder padding="lg" radius="md" data-testid={`mill-${mill.id}`}>
      <Stack gap="md">
        <Group justify="space-between" align="flex-start">
          <div>
            <Title order={2} fz={24}>
              {mill.name}
            </Title>
            <Text c="dimmed">
              Driven by{' '}
              <Anchor component={Link} to={`/engines/${mill.engineId}`}>
                {mill.engineName}
              </Anchor>{' '}
              · rated {fmt(mill.engine.ratedSpeedRpm, 0)} rpm · flywheel{' '}
              {mill.engine.flywheelMassLb
                ? `${fmt(mill.engine.flywheelMassLb, 0)} lb at k = ${fmt(mill.engine.flywheelRadiusOfGyrationFt, 2)} ft`
                : 'not described'}
            </Text>
          </div>
          {canWrite && (
            <Button component={Link} to={`/mill/mills/${mill.id}/edit`} size="lg" leftSection={<IconPencil />}>
              Edit the mill
            </Button>
          )}
        </Group>
        {mill.notes && <Text style={{ whiteSpace: 'pre-wrap' }}>{mill.notes}</Text>}
        <Table.ScrollContainer minWidth={700}>
          <Table verticalSpacing="sm" aria-label="Stands">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Stand</Table.Th>
                <Table.Th>Roll diameter</Table.Th>
                <Table.Th>Barrel length</Table.Th>
                <Table.Th>Roll speed ÷ engine speed</Table.Th>
                <Table.Th>Maximum separating force</Table.Th>
                <Table.Th>Notes</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {mill.stands.map((st) => (
                <Table.Tr key={st.id}>
                  <Table.Td fw={600}>
                    {st.position}. {st.name}
                  </Table.Td>
                  <Table.Td className="cj-num">
                    {fmt(st.rollDiameterMm, 1)} mm ({inchesText(st.rollDiameterMm)})
                  </Table.Td>
                  <Table.Td className="cj-num">
                    {fmt(st.barrelLengthMm, 0)} mm ({inchesText(st.barrelLengthMm)})
                  </Table.Td>
                  <Table.Td className="cj-num">{fmt(st.rollSpeedRatio, 2)}</Table.Td>
                  <Table.Td className="cj-num">{fmt(st.maxSeparatingForceKn, 0)} kN</Table.Td>
                  <Table.Td>
                    <Text fz="sm">{st.notes}</Text>
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
        <Grid gap="lg">
          <Grid.Col span={{ base: 12, md: 6 }}>
            <Title order={3} fz="lg" mb="xs">
              Pass checks
            </Title>
            <SimpleGrid cols={2} spacing="md">
              <Setting label="Warn below">{pct(s.minSpeedFraction, 0)} of rated speed</Setting>
              <Setting label="Mechanical efficiency">{pct(s.mechanicalEfficiency, 0)}</Setting>
              <Setting label="Base load">{fmt(s.baseLoadHp, 0)} hp</Setting>
              <Setting label="Indicated power without cards">{fmt(s.defaultIndicatedHp, 0)} hp</Setting>
              <Setting label="Friction allowance on roll force">×{fmt(s.frictionFactor, 2)}</Setting>
            </SimpleGrid>
            <Text fz="sm" c="dimmed" mt="xs">
              Logged passes take the engine’s indicated power from the run’s latest card set before the pass; where the run has none, the
              figure above.
            </Text>
          </Grid.Col>
          <Grid.Col span={{ base: 12, md: 6 }}>
            <Title order={3} fz="lg" mb="xs">
              Quote rates
            </Title>
            <SimpleGrid cols={2} spacing="md">
              <Setting label="Stock">{money(r.stockRatePerTonne, r.currency)} / t</Setting>
              <Setting label="Yield loss">{fmt(r.yieldLossPct, 1)} % of stock</Setting>
              <Setting label="Engine time">{money(r.engineRatePerHour, r.currency)} / h</Setting>
              <Setting label="Crew">
                {r.crewSize} × {money(r.crewRatePerPersonHour, r.currency)} / h
              </Setting>
              <Setting label="Contingency, margin">
                {fmt(r.contingencyPct, 1)} %, {fmt(r.marginPct, 1)} %
              </Setting>
              <Setting label="Fixed costs">
                {r.fixedCosts.map((f) => `${f.label} ${money(f.amount, r.currency)}`).join(' · ') || 'none'}
              </Setting>
            </SimpleGrid>
          </Grid.Col>
        </Grid>
        <Caution title="Hot steel and heavy rolls">{MILL_CAUTION}</Caution>
      </Stack>
    </Card>
  );
}
