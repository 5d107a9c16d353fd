import { useEffect, useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Card, Group, NumberInput, Select, Stack, Text, TextInput, Title } from '@mantine/core';
import { IconArrowsExchange, IconCircleCheck } from '@tabler/icons-react';
import type { BarDto, LoggedPassDto, MillStandDto } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { scheduleQuery, useLogPass } from '../api/mill.api';
import { fmt, pct } from '../model/format';
import { SectionInput, sectionDraft, sectionOf, type SectionDraft } from './SectionInput';
import { PassWarnings } from './PassWarnings';

const turned = (s: SectionDraft): SectionDraft => (s.shape === 'round' ? { ...s } : { ...s, heightMm: s.widthMm, widthMm: s.heightMm });

/** "Log a pass": the measured temperature and exit size of the next pass of a bar; the calculation comes back at once. */
export function LogPass({
  runId,
  bars,
  stands,
  barId,
  onBarChange,
}: {
  runId: string;
  bars: BarDto[];
  stands: (MillStandDto & { id: string })[];
  barId: string | null;
  onBarChange: (id: string | null) => void;
}) {
  const bar = bars.find((b) => b.id === barId) ?? null;
  const schedule = useQuery({ ...scheduleQuery(bar?.scheduleId ?? ''), enabled: !!bar?.scheduleId });
  const log = useLogPass(runId);
  const nextNumber = (bar?.passes.length ?? 0) > 0 ? Math.max(...bar!.passes.map((p) => p.passNumber)) + 1 : 1;
  const [passNumber, setPassNumber] = useState<number | ''>(nextNumber);
  const [stand, setStand] = useState<string | null>(null);
  const [entry, setEntry] = useState<SectionDraft>(sectionDraft());
  const [exit, setExit] = useState<SectionDraft>(sectionDraft());
  const [temperature, setTemperature] = useState<number | ''>('');
  const [notes, setNotes] = useState('');
  const [last, setLast] = useState<LoggedPassDto | null>(null);

  const planned = useMemo(() => schedule.data?.passes.find((p) => p.seq === passNumber) ?? null, [schedule.data, passNumber]);
  // Prefill from the schedule, else from the bar's last pass (turned) or its stock.
  useEffect(() => setPassNumber(nextNumber), [barId, nextNumber]);
  useEffect(() => {
    if (!bar) return;
    const prev = bar.passes.find((p) => p.passNumber === Number(passNumber) - 1);
    if (planned) {
      setEntry(sectionDraft(planned.entry));
      setExit(sectionDraft(planned.exit));
      setStand(String(planned.standPosition));
      setTemperature(planned.expectedTemperatureC);
    } else {
      const base = prev ? turned(sectionDraft(prev.exit)) : sectionDraft(bar.stock);
      setEntry(base);
      setExit({ shape: base.shape, heightMm: '', widthMm: '' });
      setStand(prev ? String(prev.standPosition) : stands[0] ? String(stands[0].position) : null);
      setTemperature('');
    }
    setNotes('');
    // eslint-disable-next-line react-hooks/exhaustive-deps -- prefill on another bar or pass; a refetch must not overwrite typing
  }, [barId, passNumber, planned?.id, bar?.passes.length]);

  const submit = () => {
    if (!bar) return;
    const body = {
      clientId: crypto.randomUUID(),
      passNumber: passNumber === '' ? (undefined as unknown as number) : Number(passNumber),
      standPosition: Number(stand ?? 0),
      measuredTemperatureC: temperature === '' ? (undefined as unknown as number) : Number(temperature),
      entry: sectionOf(entry) ?? undefined,
      exit: sectionOf(exit) ?? (undefined as never),
      notes: notes || undefined,
    };
    log.mutate({ barId: bar.id, req: body }, { onSuccess: (p) => setLast(p) });
  };

  return (
    <Card withBorder padding="lg">
      <Title order={2} fz="xl" mb="sm">
        Log a pass
      </Title>
      <Stack gap="sm">
        <Group align="flex-end" gap="md" wrap="wrap">
          <Select
            label="Bar"
            w={160}
            data={bars.map((b) => ({ value: b.id, label: b.barCode }))}
            value={barId}
            onChange={onBarChange}
            allowDeselect={false}
          />
          <NumberInput
            label="Pass number"
            w={130}
            min={1}
            hideControls
            inputMode="numeric"
            value={passNumber}
            onChange={(v) => setPassNumber(v === '' ? '' : Number(v))}
          />
          <Select
            label="Stand"
            w={240}
            data={stands.map((s) => ({ value: String(s.position), label: `${s.position}. ${s.name}` }))}
            value={stand}
            onChange={setStand}
            allowDeselect={false}
          />
          <NumberInput
            label="Measured temperature, °C"
            w={210}
            hideControls
            inputMode="decimal"
            value={temperature}
            onChange={(v) => setTemperature(v === '' ? '' : Number(v))}
          />
        </Group>
        {planned && (
          <Text fz="sm" c="dimmed">
            Planned in “{schedule.data?.name}”: stand {planned.standPosition}, expected {fmt(planned.expectedTemperatureC, 0)} °C. Change
            the figures to what was measured.
          </Text>
        )}
        <Group align="flex-end" gap="xs" wrap="wrap">
          <SectionInput label="Entry" value={entry} onChange={setEntry} />
          <Button variant="default" mb={26} leftSection={<IconArrowsExchange size={18} />} onClick={() => setEntry(turned(entry))}>
            Turn
          </Button>
        </Group>
        <SectionInput label="Measured exit" value={exit} onChange={setExit} />
        <TextInput label="Notes" value={notes} onChange={(e) => setNotes(e.currentTarget.value)} />
        {log.error && (
          <Alert color="signal" role="alert" title="Not logged">
            {errorText(log.error)}
          </Alert>
        )}
        <Button size="lg" onClick={submit} loading={log.isPending} disabled={!bar} w="fit-content">
          Log pass
        </Button>
        {last && (
          <Stack gap="xs" data-testid="last-pass-result">
            <Group gap="xs">
              <IconCircleCheck color="var(--mantine-color-copper-5)" aria-hidden />
              <Text fw={600}>
                Pass {last.passNumber} of {last.barCode} logged: {fmt(last.calc.forceKn, 0)} kN on {last.standName} (
                {pct(last.calc.standForceUtilisation, 0)} of its maximum)
                {last.calc.flywheel
                  ? `, speed ${fmt(last.calc.flywheel.startSpeedRpm, 1)} → ${fmt(last.calc.flywheel.endSpeedRpm, 1)} rpm`
                  : ''}
                .
              </Text>
            </Group>
            <PassWarnings warnings={last.calc.warnings} />
          </Stack>
        )}
      </Stack>
    </Card>
  );
}
