import { useEffect, useMemo, useState } from 'react';
import { Alert, Button, Group, Modal, Select, Stack, Table, Text, Textarea, TextInput } from '@mantine/core';
import { IconPencil } from '@tabler/icons-react';
import dayjs from 'dayjs';
import type { ReadingDto } from '@crankjournal/shared-types';
import { useOutbox } from '../../../api/useOutbox';
import { useUnits } from '../../units/useUnits';
import type { EnginePoint } from './Board';
import { parseEntered, unitLabel } from './round-check';

const SOURCE_WORDS: Record<ReadingDto['source'], string> = { round: 'Round', logger: 'Logger', import: 'CSV import', live: 'Live entry' };
const PAGE = 60;

/** Decimals a recorded number was written with (at most 4), so the record shows exactly what was logged. */
export function recordedDecimals(v: number): number {
  const m = /\.(\d+)$/.exec(String(v));
  return Math.min(4, m ? m[1].length : 0);
}

/** A value as recorded: after an amendment the original stays, struck through, with who, when and why. */
export function RecordedValue({ reading }: { reading: ReadingDto }) {
  const units = useUnits();
  // In the unit it was logged in, a number is shown to the decimals it was logged with (a record is not rounded).
  const display = (v: number, unit: string) => {
    const d = units.display(v, unit);
    return d.converted ? d : units.display(v, unit, { decimals: Math.max(recordedDecimals(v), 0) });
  };
  const now = display(reading.value, reading.unit);
  const amended = reading.amendments.length > 0 || reading.originalValue !== null;
  return (
    <Stack gap={2}>
      <Group gap={8} wrap="nowrap" align="baseline">
        {amended && reading.originalValue !== null && (
          <Text span className="cj-struck cj-num" fz="md" aria-label={`originally ${display(reading.originalValue, reading.unit).label}`}>
            {display(reading.originalValue, reading.unit).text}
          </Text>
        )}
        <Text span className="cj-num" fz="lg" fw={600}>
          {now.text}
        </Text>
        <Text span fz="sm" c="dimmed">
          {now.unitLabel}
        </Text>
      </Group>
      {reading.amendments.map((a) => (
        <Text key={a.id} fz="xs" c="dimmed">
          Amended {display(a.oldValue, reading.unit).text} → {display(a.newValue, reading.unit).text} by {a.byName},{' '}
          {dayjs(a.at).format('D MMM HH:mm')}: “{a.reason}”
        </Text>
      ))}
    </Stack>
  );
}

/** Every reading of the run, newest first, with amendment for those who may. */
export function ReadingsTable({
  readings,
  points,
  canAmend,
  onAmend,
}: {
  readings: ReadingDto[];
  points: EnginePoint[];
  canAmend: boolean;
  onAmend: (r: ReadingDto) => void;
}) {
  const [pointId, setPointId] = useState<string | null>(null);
  const [shown, setShown] = useState(PAGE);
  const byId = useMemo(() => new Map(points.map((p) => [p.id, p])), [points]);
  const { pending } = useOutbox();
  const waiting = useMemo(() => {
    const m = new Map<string, number[]>();
    for (const q of pending) {
      const id = q.kind === 'reading-amendment' ? q.ref?.readingId : undefined;
      if (id) m.set(id, [...(m.get(id) ?? []), (q.body as { value: number }).value]);
    }
    return m;
  }, [pending]);
  const rows = useMemo(() => {
    const list = pointId ? readings.filter((r) => r.pointId === pointId) : readings;
    return [...list].reverse();
  }, [readings, pointId]);
  return (
    <Stack gap="sm">
      <Group justify="space-between" wrap="wrap">
        <Select
          label="Point"
          placeholder="All points"
          clearable
          data={[...points].sort((a, b) => a.sequence - b.sequence).map((p) => ({ value: p.id, label: `${p.label} (${p.code})` }))}
          value={pointId}
          onChange={(v) => {
            setPointId(v);
            setShown(PAGE);
          }}
          w={320}
        />
        <Text fz="sm" c="dimmed">
          {rows.length} reading(s)
        </Text>
      </Group>
      {rows.length === 0 ? (
        <Text c="dimmed">No readings yet.</Text>
      ) : (
        <Table.ScrollContainer minWidth={640}>
          <Table verticalSpacing="xs" aria-label="Readings">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Taken</Table.Th>
                <Table.Th>Point</Table.Th>
                <Table.Th>Value</Table.Th>
                <Table.Th>Source</Table.Th>
                {canAmend && <Table.Th aria-label="Actions" />}
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {rows.slice(0, shown).map((r) => {
                const p = byId.get(r.pointId);
                return (
                  <Table.Tr key={r.id} data-testid={`reading-${r.id}`}>
                    <Table.Td className="cj-num">{dayjs(r.takenAt).format('HH:mm:ss')}</Table.Td>
                    <Table.Td>
                      <Text fz="sm" fw={600}>
                        {p?.label ?? r.pointId}
                      </Text>
                      <Text fz="xs" c="dimmed">
                        {p?.code}
                      </Text>
                    </Table.Td>
                    <Table.Td>
                      <RecordedValue reading={r} />
                      {waiting.get(r.id)?.map((v, i) => (
                        <Text key={i} fz="xs" c="dimmed" data-testid="amendment-waiting">
                          Amendment to {v} waiting to send
                        </Text>
                      ))}
                    </Table.Td>
                    <Table.Td>
                      <Text fz="sm">{SOURCE_WORDS[r.source] ?? r.source}</Text>
                      {r.enteredByName && (
                        <Text fz="xs" c="dimmed">
                          {r.enteredByName}
                        </Text>
                      )}
                    </Table.Td>
                    {canAmend && (
                      <Table.Td ta="right">
                        <Button
                          variant="default"
                          size="md"
                          h={48}
                          leftSection={<IconPencil size={18} />}
                          onClick={() => onAmend(r)}
                          aria-label={`Amend ${p?.label ?? ''} at ${dayjs(r.takenAt).format('HH:mm:ss')}`}
                        >
                          Amend
                        </Button>
                      </Table.Td>
                    )}
                  </Table.Tr>
                );
              })}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
      {rows.length > shown && (
        <Button variant="default" size="lg" onClick={() => setShown((n) => n + PAGE)}>
          Show {Math.min(PAGE, rows.length - shown)} older
        </Button>
      )}
    </Stack>
  );
}

/** Asks for the corrected value and why; says that the original stays in the record. */
export function AmendModal({
  reading,
  point,
  onClose,
  onAmend,
  busy,
  error,
}: {
  reading: ReadingDto | null;
  point?: EnginePoint;
  onClose: () => void;
  onAmend: (r: ReadingDto, value: number, reason: string) => void;
  busy: boolean;
  error: string | null;
}) {
  const [value, setValue] = useState('');
  const [reason, setReason] = useState('');
  useEffect(() => {
    setValue('');
    setReason('');
  }, [reading?.id]);
  const v = parseEntered(value);
  const valueOk = v !== null && !Number.isNaN(v);
  const ready = valueOk && reason.trim().length > 0 && v !== reading?.value;
  return (
    <Modal
      opened={!!reading}
      onClose={onClose}
      centered
      size="lg"
      title={
        <Text fw={700} fz="lg">
          Amend a reading
        </Text>
      }
    >
      {reading && (
        <form
          onSubmit={(e) => {
            e.preventDefault();
            if (ready) onAmend(reading, v!, reason.trim());
          }}
        >
          <Stack>
            <Text>
              <b>{point?.label ?? reading.pointId}</b> at {dayjs(reading.takenAt).format('HH:mm:ss')}: recorded{' '}
              <span className="cj-num">
                {reading.value} {unitLabel(reading.unit)}
              </span>
            </Text>
            <Text fz="sm">
              A log is a record: the value now shown is replaced, but the original stays visible, struck through, with your name, the time
              and your reason. Enter the value in {unitLabel(reading.unit)}, the unit it was recorded in.
            </Text>
            {error && (
              <Alert color="signal" role="alert">
                {error}
              </Alert>
            )}
            <TextInput
              label={`Corrected value (${unitLabel(reading.unit)})`}
              inputMode="decimal"
              autoComplete="off"
              value={value}
              onChange={(e) => setValue(e.currentTarget.value)}
              error={value !== '' && !valueOk ? 'Not a number.' : v === reading.value ? 'That is the value already recorded.' : undefined}
              data-autofocus
              styles={{ input: { height: 56, fontSize: 26, fontVariantNumeric: 'tabular-nums' } }}
            />
            <Textarea
              label="Reason for the amendment"
              required
              rows={2}
              value={reason}
              onChange={(e) => setReason(e.currentTarget.value)}
              placeholder="e.g. misread the gauge: 152, not 125"
            />
            <Group justify="flex-end">
              <Button variant="default" size="lg" onClick={onClose}>
                Cancel
              </Button>
              <Button type="submit" size="lg" disabled={!ready} loading={busy}>
                Record amendment
              </Button>
            </Group>
          </Stack>
        </form>
      )}
    </Modal>
  );
}
