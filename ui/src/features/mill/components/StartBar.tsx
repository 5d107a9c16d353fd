import { useEffect, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Card, Group, NumberInput, Select, Stack, TextInput, Title } from '@mantine/core';
import type { BarDto } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { lotsQuery, schedulesQuery, useCreateBar } from '../api/mill.api';
import { SectionInput, sectionDraft, sectionOf } from './SectionInput';

const NONE = 'none';

/** The next bar id after the run's bars: B-07 after B-06. */
export function nextBarCode(bars: BarDto[]): string {
  const last = bars[bars.length - 1]?.barCode;
  const m = last ? /^(.*?)(\d+)$/.exec(last) : null;
  if (!m) return `B-${String(bars.length + 1).padStart(2, '0')}`;
  return `${m[1]}${String(Number(m[2]) + 1).padStart(m[2].length, '0')}`;
}

/** "Start a bar": its id, the schedule it follows (or its stock), and the lot it is for. */
export function StartBar({
  runId,
  millId,
  bars,
  onStarted,
}: {
  runId: string;
  millId: string;
  bars: BarDto[];
  onStarted: (bar: BarDto) => void;
}) {
  const schedules = useQuery(schedulesQuery({ millId }));
  const lots = useQuery(lotsQuery());
  const create = useCreateBar(runId);
  const [code, setCode] = useState(nextBarCode(bars));
  const [choice, setChoice] = useState<string>(bars[bars.length - 1]?.scheduleId ?? NONE);
  const scheduleId = choice === NONE ? null : choice;
  const [lotId, setLotId] = useState<string | null>(bars[bars.length - 1]?.lotId ?? null);
  const [stock, setStock] = useState(sectionDraft({ shape: 'rectangle', heightMm: 76.2, widthMm: 76.2 }));
  const [length, setLength] = useState<number | ''>(1800);
  useEffect(() => setCode(nextBarCode(bars)), [bars]);
  const options = [
    { value: NONE, label: 'None (give the stock)' },
    ...(schedules.data ?? [])
      .filter((s) => !s.archived)
      .map((s) => ({ value: s.id, label: `${s.isTemplate ? 'Template: ' : ''}${s.name}` })),
  ];
  const submit = () =>
    create.mutate(
      {
        barCode: code,
        scheduleId,
        lotId,
        ...(scheduleId ? {} : { stock: sectionOf(stock) ?? undefined, stockLengthMm: length === '' ? undefined : Number(length) }),
      },
      { onSuccess: onStarted },
    );
  return (
    <Card withBorder padding="lg" data-testid="start-bar">
      <Title order={2} fz="xl" mb="sm">
        Start a bar
      </Title>
      <Stack gap="sm">
        <Group align="flex-end" gap="md" wrap="wrap">
          <TextInput label="Bar id" w={140} value={code} onChange={(e) => setCode(e.currentTarget.value)} />
          <Select
            label="Pass schedule"
            w={340}
            data={options}
            value={choice}
            allowDeselect={false}
            onChange={(v) => setChoice(v ?? NONE)}
          />
          <Select
            label="Customer lot"
            w={300}
            clearable
            placeholder="None"
            data={(lots.data ?? [])
              .filter((l) => l.status !== 'dispatched')
              .map((l) => ({ value: l.id, label: `${l.reference} · ${l.customerName}` }))}
            value={lotId}
            onChange={setLotId}
          />
        </Group>
        {!scheduleId && (
          <Group align="flex-end" gap="md" wrap="wrap">
            <SectionInput label="Stock" value={stock} onChange={setStock} />
            <NumberInput
              label="Stock length, mm"
              w={170}
              hideControls
              inputMode="decimal"
              value={length}
              onChange={(v) => setLength(v === '' ? '' : Number(v))}
              description=" "
            />
          </Group>
        )}
        {create.error && (
          <Alert color="signal" role="alert">
            {errorText(create.error)}
          </Alert>
        )}
        <Button onClick={submit} loading={create.isPending} disabled={!code.trim()} w="fit-content" size="lg">
          Start bar
        </Button>
      </Stack>
    </Card>
  );
}
