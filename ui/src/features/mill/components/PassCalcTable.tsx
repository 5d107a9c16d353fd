import { Fragment, useState, type ReactNode } from 'react';
import { ActionIcon, SimpleGrid, Stack, Table, Text } from '@mantine/core';
import { IconChevronDown, IconChevronRight } from '@tabler/icons-react';
import type { PassCalculationDto, SectionDto } from '@crankjournal/shared-types';
import { fmt, pct, sectionText, seconds } from '../model/format';
import { ExtrapolatedBadge, FlowStressNote, PassWarnings } from './PassWarnings';

export interface PassRow {
  key: string;
  passNumber: number;
  standName: string;
  entry: SectionDto;
  exit: SectionDto;
  temperatureC: number;
  /** e.g. "expected" or "measured" */
  temperatureWord: string;
  calc: PassCalculationDto | null;
  calcError?: string | null;
  /** extra cells before the calculation (time, bar…) */
  lead?: ReactNode;
  notes?: string;
  planned?: SectionDto | null;
}

function Figure({ label, children }: { label: string; children: ReactNode }) {
  return (
    <Stack gap={0}>
      <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
        {label}
      </Text>
      <Text className="cj-num" fz="sm">
        {children}
      </Text>
    </Stack>
  );
}

/** The working of one pass: every figure, the sources and the model cited. */
export function PassWorking({ calc }: { calc: PassCalculationDto }) {
  const f = calc.flywheel;
  return (
    <Stack gap="sm" py="xs">
      <SimpleGrid cols={{ base: 2, sm: 4, lg: 6 }} spacing="sm">
        <Figure label="Draft">{fmt(calc.draftMm, 1)} mm</Figure>
        <Figure label="Height reduction">{pct(calc.reduction)}</Figure>
        <Figure label="Area reduction">{pct(calc.areaReduction)}</Figure>
        <Figure label="Elongation">{fmt(calc.elongation, 3)}</Figure>
        <Figure label="True strain">{fmt(calc.trueStrain, 3)}</Figure>
        <Figure label="Contact length">{fmt(calc.contactLengthMm, 1)} mm</Figure>
        <Figure label="Roll speed">{fmt(calc.rollSpeedRpm, 1)} rpm</Figure>
        <Figure label="Surface speed">{fmt(calc.rollSurfaceSpeedMPerS, 2)} m/s</Figure>
        <Figure label="Strain rate">{fmt(calc.meanStrainRatePerS, 1)} /s</Figure>
        <Figure label="Mean flow stress">{fmt(calc.flowStress.meanFlowStressMPa, 0)} MPa</Figure>
        <Figure label="Friction allowance">×{fmt(calc.frictionFactor, 2)}</Figure>
        <Figure label="Roll force">
          {fmt(calc.forceKn, 0)} kN ({fmt(calc.forceLbf, 0)} lbf)
        </Figure>
        <Figure label="Stand maximum">
          {fmt(calc.standMaxForceKn, 0)} kN ({pct(calc.standForceUtilisation, 0)} used)
        </Figure>
        <Figure label="Torque per roll">
          {fmt(calc.torquePerRollKnM, 1)} kN·m ({fmt(calc.torquePerRollLbfFt, 0)} lbf·ft)
        </Figure>
        <Figure label="Power, roll pair">
          {fmt(calc.powerRollPairKw, 0)} kW ({fmt(calc.powerRollPairHp, 0)} hp)
        </Figure>
      </SimpleGrid>
      {f && (
        <SimpleGrid cols={{ base: 2, sm: 4, lg: 6 }} spacing="sm">
          <Figure label="Flywheel energy">{fmt(f.storedEnergyKj / 1000, 2)} MJ</Figure>
          <Figure label="Bar out of the rolls">{fmt(f.barExitLengthM, 2)} m</Figure>
          <Figure label="Pass lasts">{seconds(f.passDurationS)}</Figure>
          <Figure label="Pass energy">{fmt(f.passEnergyKj, 0)} kJ</Figure>
          <Figure label="Speed before">{fmt(f.startSpeedRpm, 1)} rpm</Figure>
          <Figure label="Speed after">
            {fmt(f.endSpeedRpm, 1)} rpm (−{fmt(f.speedDropRpm, 2)})
          </Figure>
          <Figure label="Lowest allowed">{fmt(f.minAllowedSpeedRpm, 1)} rpm</Figure>
          <Figure label="Indicated power">{fmt(f.indicatedHp, 0)} hp</Figure>
          <Figure label="Power to spare">{fmt(f.surplusPowerHp, 0)} hp</Figure>
          <Figure label="Back to speed in">{f.recoveryTimeS === null ? 'never (no surplus)' : seconds(f.recoveryTimeS)}</Figure>
        </SimpleGrid>
      )}
      {f && (
        <Text fz="sm" c="dimmed">
          Speed at the start: {f.startSpeedSource}. Indicated power: {f.indicatedHpSource}. The flywheel is taken to give the whole pass.
        </Text>
      )}
      <FlowStressNote flowStress={calc.flowStress} />
    </Stack>
  );
}

/** Passes with their calculations: one line each, the working on demand, warnings beside the pass. */
export function PassCalcTable({ rows, leadHeader, caption }: { rows: PassRow[]; leadHeader?: string; caption: string }) {
  const [open, setOpen] = useState<Record<string, boolean>>({});
  const cols = 11 + (leadHeader ? 1 : 0);
  return (
    <Table.ScrollContainer minWidth={1100}>
      <Table verticalSpacing="sm" aria-label={caption}>
        <Table.Thead>
          <Table.Tr>
            <Table.Th />
            {leadHeader && <Table.Th>{leadHeader}</Table.Th>}
            <Table.Th>Pass</Table.Th>
            <Table.Th>Stand</Table.Th>
            <Table.Th>Entry → exit, mm</Table.Th>
            <Table.Th>Temp.</Table.Th>
            <Table.Th>Reduction / elongation</Table.Th>
            <Table.Th>Flow stress</Table.Th>
            <Table.Th>Roll force</Table.Th>
            <Table.Th>Torque, power</Table.Th>
            <Table.Th>Flywheel</Table.Th>
            <Table.Th>Warnings</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {rows.length === 0 && (
            <Table.Tr>
              <Table.Td colSpan={cols}>
                <Text c="dimmed" py="md">
                  No passes yet.
                </Text>
              </Table.Td>
            </Table.Tr>
          )}
          {rows.map((r) => {
            const c = r.calc;
            const flagged = !!r.calcError || (c?.warnings.length ?? 0) > 0;
            const isOpen = !!open[r.key];
            return (
              <Fragment key={r.key}>
                <Table.Tr
                  data-testid={`pass-row-${r.key}`}
                  data-flagged={flagged ? 'true' : 'false'}
                  style={flagged ? { boxShadow: 'inset 4px 0 0 var(--mantine-color-signal-6)' } : undefined}
                >
                  <Table.Td w={52}>
                    {c && (
                      <ActionIcon
                        variant="subtle"
                        size="lg"
                        aria-label={`${isOpen ? 'Hide' : 'Show'} the working of pass ${r.passNumber}`}
                        onClick={() => setOpen((o) => ({ ...o, [r.key]: !isOpen }))}
                      >
                        {isOpen ? <IconChevronDown /> : <IconChevronRight />}
                      </ActionIcon>
                    )}
                  </Table.Td>
                  {leadHeader && <Table.Td>{r.lead}</Table.Td>}
                  <Table.Td className="cj-num" fw={700}>
                    {r.passNumber}
                  </Table.Td>
                  <Table.Td>{r.standName}</Table.Td>
                  <Table.Td className="cj-num">
                    {sectionText(r.entry)} → {sectionText(r.exit)}
                    {r.planned && (r.planned.heightMm !== r.exit.heightMm || r.planned.widthMm !== r.exit.widthMm) && (
                      <Text fz="xs" c="dimmed">
                        planned {sectionText(r.planned)}
                      </Text>
                    )}
                  </Table.Td>
                  <Table.Td className="cj-num" style={{ whiteSpace: 'nowrap' }}>
                    {fmt(r.temperatureC, 0)} °C
                    <Text fz="xs" c="dimmed">
                      {r.temperatureWord}
                    </Text>
                  </Table.Td>
                  {r.calcError || !c ? (
                    <Table.Td colSpan={6}>
                      <Text c="var(--cj-signal)">{r.calcError ?? 'Not calculated.'}</Text>
                    </Table.Td>
                  ) : (
                    <>
                      <Table.Td className="cj-num">
                        {pct(c.areaReduction, 0)} · ×{fmt(c.elongation, 2)}
                        <Text fz="xs" c="dimmed">
                          contact {fmt(c.contactLengthMm, 0)} mm
                        </Text>
                      </Table.Td>
                      <Table.Td className="cj-num">
                        <Text className="cj-num" style={{ whiteSpace: 'nowrap' }}>
                          {fmt(c.flowStress.meanFlowStressMPa, 0)} MPa
                        </Text>
                        <ExtrapolatedBadge flowStress={c.flowStress} />
                      </Table.Td>
                      <Table.Td
                        className="cj-num"
                        style={{ whiteSpace: 'nowrap' }}
                        fw={c.exceedsStandForce ? 700 : undefined}
                        c={c.exceedsStandForce ? 'var(--cj-signal)' : undefined}
                      >
                        {fmt(c.forceKn, 0)} kN
                        <Text fz="xs" c="dimmed">
                          of {fmt(c.standMaxForceKn, 0)} kN ({pct(c.standForceUtilisation, 0)})
                        </Text>
                      </Table.Td>
                      <Table.Td className="cj-num">
                        {fmt(c.torquePerRollKnM, 1)} kN·m
                        <Text fz="xs" c="dimmed">
                          {fmt(c.powerRollPairKw, 0)} kW · {fmt(c.powerRollPairHp, 0)} hp
                        </Text>
                      </Table.Td>
                      <Table.Td
                        className="cj-num"
                        c={c.flywheel?.belowMinSpeed ? 'var(--cj-signal)' : undefined}
                        fw={c.flywheel?.belowMinSpeed ? 700 : undefined}
                      >
                        {c.flywheel ? (
                          <>
                            {fmt(c.flywheel.endSpeedRpm, 1)} rpm (−{fmt(c.flywheel.speedDropRpm, 1)})
                            <Text fz="xs" c="dimmed">
                              {fmt(c.flywheel.passEnergyKj, 0)} kJ · back in{' '}
                              {c.flywheel.recoveryTimeS === null ? '—' : seconds(c.flywheel.recoveryTimeS)}
                            </Text>
                          </>
                        ) : (
                          <Text fz="sm" c="dimmed">
                            no flywheel figures
                          </Text>
                        )}
                      </Table.Td>
                      <Table.Td>
                        {c.warnings.length ? <PassWarnings warnings={c.warnings} compact /> : <Text c="dimmed">none</Text>}
                      </Table.Td>
                    </>
                  )}
                </Table.Tr>
                {(isOpen || (c && c.warnings.length > 0) || r.notes) && (
                  <Table.Tr>
                    <Table.Td />
                    <Table.Td colSpan={cols - 1}>
                      {r.notes && (
                        <Text fz="sm" fs="italic" mb={4}>
                          {r.notes}
                        </Text>
                      )}
                      {c && c.warnings.length > 0 && <PassWarnings warnings={c.warnings} />}
                      {isOpen && c && <PassWorking calc={c} />}
                    </Table.Td>
                  </Table.Tr>
                )}
              </Fragment>
            );
          })}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
