import { useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Checkbox, Group, NumberInput, Select, TextInput } from '@mantine/core';
import type { BarDto } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { lotsQuery, useUpdateBar } from '../api/mill.api';

/** Weight, scrap and lot of a bar once rolled (until the run is closed). */
export function BarRecord({ bar }: { bar: BarDto }) {
  const lots = useQuery(lotsQuery());
  const update = useUpdateBar(bar.runId);
  const [weight, setWeight] = useState<number | ''>(bar.weightKg ?? '');
  const [scrapped, setScrapped] = useState(bar.scrapped);
  const [reason, setReason] = useState(bar.scrapReason ?? '');
  const [lotId, setLotId] = useState<string | null>(bar.lotId);
  const save = () =>
    update.mutate({
      id: bar.id,
      req: { weightKg: weight === '' ? null : Number(weight), scrapped, scrapReason: scrapped ? reason : null, lotId },
    });
  return (
    <Group align="flex-end" gap="sm" wrap="wrap" mt="xs" role="group" aria-label={`Record of bar ${bar.barCode}`}>
      <NumberInput
        label="Weight, kg"
        w={130}
        hideControls
        inputMode="decimal"
        value={weight}
        onChange={(v) => setWeight(v === '' ? '' : Number(v))}
      />
      <Select
        label="Lot"
        w={240}
        clearable
        data={(lots.data ?? [])
          .filter((l) => l.status !== 'dispatched' || l.id === bar.lotId)
          .map((l) => ({ value: l.id, label: `${l.reference} · ${l.customerName}` }))}
        value={lotId}
        onChange={setLotId}
      />
      <Checkbox label="Scrapped" checked={scrapped} onChange={(e) => setScrapped(e.currentTarget.checked)} mb={10} />
      {scrapped && <TextInput label="Why scrapped" w={260} value={reason} onChange={(e) => setReason(e.currentTarget.value)} />}
      <Button variant="default" onClick={save} loading={update.isPending}>
        Save bar record
      </Button>
      {update.error && (
        <Alert color="signal" role="alert" w="100%">
          {errorText(update.error)}
        </Alert>
      )}
    </Group>
  );
}
