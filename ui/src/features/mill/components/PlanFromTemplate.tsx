import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Group, Modal, Select, Stack, TextInput } from '@mantine/core';
import { IconCopy } from '@tabler/icons-react';
import { errorText } from '../../../api/http';
import { lotsQuery, millsQuery, schedulesQuery, useCopySchedule } from '../api/mill.api';

/** "Plan from a template": a new working schedule copied from a template, optionally for a customer lot. */
export function PlanFromTemplate({ templateId, size = 'lg' }: { templateId?: string; size?: 'md' | 'lg' }) {
  const [open, setOpen] = useState(false);
  const [chosen, setChosen] = useState<string | null>(templateId ?? null);
  const [name, setName] = useState('');
  const [lotId, setLotId] = useState<string | null>(null);
  const [millId, setMillId] = useState<string | null>(null);
  const mills = useQuery({ ...millsQuery(), enabled: open });
  const templates = useQuery({ ...schedulesQuery({ templates: true }), enabled: open });
  const lots = useQuery({ ...lotsQuery(), enabled: open });
  const copy = useCopySchedule();
  const navigate = useNavigate();
  const openLots = (lots.data ?? []).filter((l) => l.status !== 'dispatched');
  const submit = () =>
    chosen &&
    copy.mutate(
      { id: chosen, req: { name: name.trim(), lotId: lotId ?? undefined, millId: millId ?? undefined } },
      { onSuccess: (s) => void navigate(`/mill/schedules/${s.id}`) },
    );
  return (
    <>
      <Button size={size} leftSection={<IconCopy />} onClick={() => setOpen(true)}>
        Plan from a template
      </Button>
      <Modal opened={open} onClose={() => setOpen(false)} title="Plan a schedule from a template" size="lg">
        <Stack>
          <Select
            label="Template"
            placeholder="Choose a template"
            data={(templates.data ?? [])
              .filter((t) => !t.archived)
              .map((t) => ({ value: t.id, label: `${t.name} (${t.passCount} passes)` }))}
            value={chosen}
            onChange={(v) => {
              setChosen(v);
              const t = templates.data?.find((x) => x.id === v);
              if (t && !name) setName(t.name);
            }}
          />
          {(mills.data?.length ?? 0) > 1 && (
            <Select
              label="Mill to roll it on"
              description="Stands are matched by their position (stand 1, 2, 3…)."
              placeholder="The template’s mill"
              clearable
              data={(mills.data ?? []).map((m) => ({ value: m.id, label: m.name }))}
              value={millId}
              onChange={setMillId}
            />
          )}
          <TextInput label="Name of the new schedule" value={name} onChange={(e) => setName(e.currentTarget.value)} />
          <Select
            label="For a customer lot (optional)"
            clearable
            data={openLots.map((l) => ({ value: l.id, label: `${l.reference} · ${l.customerName}` }))}
            value={lotId}
            onChange={setLotId}
          />
          {copy.error && (
            <Alert color="signal" role="alert">
              {errorText(copy.error)}
            </Alert>
          )}
          <Group justify="flex-end">
            <Button variant="default" onClick={() => setOpen(false)}>
              Cancel
            </Button>
            <Button onClick={submit} disabled={!chosen || !name.trim()} loading={copy.isPending}>
              Plan the schedule
            </Button>
          </Group>
        </Stack>
      </Modal>
    </>
  );
}
