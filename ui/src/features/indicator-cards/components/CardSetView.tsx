import { useState, type ReactNode } from 'react';
import { Badge, Box, Button, Collapse, Group, Paper, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import { IconChevronDown, IconChevronUp, IconEye, IconPencil, IconPlus } from '@tabler/icons-react';
import { TRACE_ORIGIN_LABELS, type CardDto, type CardSetDto } from '@crankjournal/shared-types';
import { cardTitle, fmt, pct, timeOnly } from '../model/format';
import { AmendmentList } from './AmendmentList';
import { AmendCardModal } from './AmendCardModal';
import { AmendSetModal } from './AmendSetModal';
import { AddCardModal, type MissingEnd } from './AddCardModal';
import { CardSetSummary } from './CardSetSummary';
import { PvDiagram } from './PvDiagram';
import { TraceReviewModal } from './TraceReviewModal';

function Stat({ label, children, testId }: { label: string; children: ReactNode; testId?: string }) {
  return (
    <Stack gap={0} data-testid={testId}>
      <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
        {label}
      </Text>
      <Text fz="lg" className="cj-num">
        {children}
      </Text>
    </Stack>
  );
}

/** Why a figure is not shown, under its dash. */
function Absent({ reason }: { reason: string }) {
  return (
    <Text fz="xs" c="dimmed" lh={1.2}>
      Not shown: {reason}
    </Text>
  );
}

const source = (s: 'entered' | 'reading' | null, at?: string | null) =>
  s === 'reading' ? (at ? ` (reading ${timeOnly(at)})` : ' (reading)') : s === 'entered' ? ' (entered)' : '';

/**
 * One card set: its moment and figures, the summary table, each card as a p–V diagram over its ideal card, and
 * the record of amendments.
 */
export function CardSetView({ set, canWrite, defaultOpen }: { set: CardSetDto; canWrite: boolean; defaultOpen: boolean }) {
  const [open, setOpen] = useState(defaultOpen);
  const [amending, setAmending] = useState<CardDto | null>(null);
  const [reviewing, setReviewing] = useState<CardDto | null>(null);
  const [adding, setAdding] = useState<MissingEnd | null>(null);
  const [amendingSet, setAmendingSet] = useState(false);
  const r = set.results;
  const taken = new Date(set.takenAt);
  const endResult = (c: CardDto) => r.cylinders.find((x) => x.label === c.cylinderLabel)?.ends.find((e) => e.cardId === c.id);
  const total = set.cylinders.length * 2;

  return (
    <Paper withBorder p="md" radius="md" data-testid="card-set" data-set-id={set.id}>
      <Group justify="space-between" align="flex-start" wrap="wrap">
        <Stack gap={2}>
          <Title order={3} fz="lg">
            Set at {taken.toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' })}
            <Text span c="dimmed" fz="sm" ml="xs">
              {taken.toLocaleDateString(undefined, { weekday: 'short', day: 'numeric', month: 'short', year: 'numeric' })}
            </Text>
          </Title>
          <Group gap="xs">
            {r.complete ? (
              <Badge variant="light" color="gray">
                All {total} cards
              </Badge>
            ) : (
              <Badge variant="outline" color="amber">
                {set.cards.length} of {total} cards
              </Badge>
            )}
            {set.amendments.length + set.cards.reduce((n, c) => n + c.amendments.length, 0) > 0 && (
              <Badge variant="outline" color="gray">
                Amended
              </Badge>
            )}
            <Text fz="xs" c="dimmed">
              Taken by {set.createdByName}
            </Text>
          </Group>
        </Stack>
        <Stack gap={0} align="flex-end">
          {!r.complete && (
            <Text fz="xs" fw={700} c="amber.8" data-testid="card-set-total-basis">
              Sum of the cards present
            </Text>
          )}
          <Text fz={32} fw={700} className="cj-num" lh={1.1} data-testid="card-set-total">
            {fmt(r.totalIndicatedHorsepower, 0)} ihp
          </Text>
          <Text c="dimmed" className="cj-num">
            {fmt(r.totalIndicatedKilowatts, 0)} kW
          </Text>
        </Stack>
      </Group>
      {!r.complete && (
        <Text fz="sm" mt={4} data-testid="card-set-incomplete">
          Incomplete set, not the engine&apos;s power. Missing: {r.missingEnds.map((m) => `${m.cylinderLabel} ${m.end} end`).join(', ')}.
        </Text>
      )}

      <SimpleGrid cols={{ base: 2, sm: 3, lg: 5 }} mt="sm" spacing="sm">
        <Stat label="Speed">
          {fmt(set.speedRpm, 1)} rpm
          <Text span fz="xs" c="dimmed">
            {source(set.speedSource, set.speedReadingAt)}
          </Text>
        </Stat>
        <Stat label="Cut-off">{set.cutOffPercent !== null ? `${fmt(set.cutOffPercent, 0)} %` : '—'}</Stat>
        <Stat label="Throttle / receiver">
          {fmt(set.throttlePressurePsig, 1)} / {fmt(set.receiverPressurePsig, 1)} psig
        </Stat>
        <Stat label="Vacuum" testId="stat-vacuum">
          {fmt(set.vacuumInHg, 1)} inHg
          <Text fz="xs" c={r.atmosphereBasis === 'standard' ? 'amber.8' : 'dimmed'} lh={1.2}>
            {r.atmosphereBasis === 'barometer'
              ? `against the barometer, ${fmt(set.barometerInHg, 2)} inHg${source(set.barometerSource)}`
              : 'no barometer: against the standard atmosphere, 29.92 inHg'}
          </Text>
        </Stat>
        <Stat label="Referred MEP" testId="stat-referred">
          {r.referredMeanEffectivePressurePsi !== null
            ? `${fmt(r.referredMeanEffectivePressurePsi, 1)} psi on ${r.referredToCylinderLabel}`
            : '—'}
          {r.referredMeanEffectivePressureMissing && <Absent reason={r.referredMeanEffectivePressureMissing} />}
        </Stat>
        <Stat label="Receiver drop">{fmt(r.receiverDropPsi, 1)} psi</Stat>
        <Stat label="Mechanical efficiency" testId="stat-mech-eff">
          {r.brake?.mechanicalEfficiency != null ? `${pct(r.brake.mechanicalEfficiency, 1)} (${fmt(r.brake.brakeHorsepower, 0)} bhp)` : '—'}
          {r.brake?.mechanicalEfficiencyMissing && <Absent reason={r.brake.mechanicalEfficiencyMissing} />}
        </Stat>
        <Stat label="Steam accounted for">
          {r.steamAccountedForLbPerIhpHour !== null ? `${fmt(r.steamAccountedForLbPerIhpHour, 1)} lb/ihp·h` : '—'}
        </Stat>
        {r.cylinders.map((c) => (
          <Stat key={c.cylinderId} label={`${c.label} share`}>
            {pct(c.workShare)}
            {c.workShare === null && r.workSharesMissing && <Absent reason={r.workSharesMissing} />}
          </Stat>
        ))}
      </SimpleGrid>

      <Button
        mt="sm"
        variant="subtle"
        onClick={() => setOpen((o) => !o)}
        rightSection={open ? <IconChevronUp size={16} /> : <IconChevronDown size={16} />}
      >
        {open ? 'Hide the cards' : 'Show the cards and the summary'}
      </Button>
      <Collapse expanded={open}>
        <Stack gap="md" mt="sm">
          <CardSetSummary set={set} />
          <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md">
            {set.cards.map((c) => {
              const e = endResult(c);
              return (
                <Box key={c.id} data-testid="card-panel">
                  <Group justify="space-between" mb={4} wrap="wrap">
                    <Stack gap={0}>
                      <Text fw={600}>
                        {cardTitle(c)} · MEP {fmt(c.meanEffectivePressurePsi, 1)} psi
                        {e?.diagramFactor != null ? ` · diagram factor ${fmt(e.diagramFactor, 2)}` : ''}
                      </Text>
                      {c.traceOrigin && (
                        <Text fz="sm" c="dimmed" data-testid="card-trace-origin">
                          {TRACE_ORIGIN_LABELS[c.traceOrigin]}
                        </Text>
                      )}
                    </Stack>
                    <Group gap={6}>
                      {c.trace && (
                        <Button size="compact-md" variant="default" leftSection={<IconEye size={16} />} onClick={() => setReviewing(c)}>
                          Review trace
                        </Button>
                      )}
                      {canWrite && (
                        <Button size="compact-md" variant="default" leftSection={<IconPencil size={16} />} onClick={() => setAmending(c)}>
                          Amend
                        </Button>
                      )}
                    </Group>
                  </Group>
                  <PvDiagram
                    outline={c.outline}
                    ideal={e?.ideal?.outline ?? null}
                    label={`${cardTitle(c)}: pressure against volume${e?.ideal ? ', with the ideal card dashed' : ''}`}
                  />
                  {e?.idealMissing && (
                    <Text fz="xs" c="dimmed">
                      No ideal card: {e.idealMissing}.
                    </Text>
                  )}
                  <AmendmentList amendments={c.amendments} testId="card-amendments" />
                </Box>
              );
            })}
          </SimpleGrid>
          {canWrite && r.missingEnds.length > 0 && (
            <Group gap="sm">
              {r.missingEnds.map((m) => (
                <Button
                  key={`${m.cylinderId}-${m.end}`}
                  variant="default"
                  leftSection={<IconPlus size={16} />}
                  onClick={() => setAdding(m)}
                >
                  Add the {m.cylinderLabel} {m.end} end card
                </Button>
              ))}
            </Group>
          )}
          {set.notes && <Text fz="sm">Notes: {set.notes}</Text>}
          {r.notes.length > 0 && (
            <Stack gap={2}>
              {r.notes.map((n) => (
                <Text key={n} fz="xs" c="dimmed">
                  {n}
                </Text>
              ))}
            </Stack>
          )}
          <AmendmentList amendments={set.amendments} testId="set-amendments" />
          {canWrite && (
            <Group>
              <Button variant="default" leftSection={<IconPencil size={16} />} onClick={() => setAmendingSet(true)}>
                Amend the set’s figures
              </Button>
            </Group>
          )}
        </Stack>
      </Collapse>

      <AmendCardModal set={set} card={amending} onClose={() => setAmending(null)} />
      <TraceReviewModal card={reviewing} onClose={() => setReviewing(null)} />
      <AddCardModal set={set} missing={adding} onClose={() => setAdding(null)} />
      <AmendSetModal set={set} opened={amendingSet} onClose={() => setAmendingSet(false)} />
    </Paper>
  );
}
