import { useEffect, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Card, Group, List, Loader, MultiSelect, Select, Stack, Text, TextInput, Textarea } from '@mantine/core';
import { useForm } from '@mantine/form';
import { notifications } from '@mantine/notifications';
import { ROLE_LABELS, RUN_PURPOSES, RUN_PURPOSE_LABELS, type CrewMemberSummary, type RunPurpose } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { HttpError, api, errorText } from '../../../api/http';
import { enginesListQuery } from '../../engines/api/engines.api';
import { useCreateRun } from '../api/runs.api';

const purposeOptions = RUN_PURPOSES.map((p) => ({ value: p, label: RUN_PURPOSE_LABELS[p] }));

export default function NewRunPage() {
  const navigate = useNavigate();
  const [params] = useSearchParams();
  const engines = useQuery(enginesListQuery());
  const crew = useQuery({ queryKey: ['users', 'crew'], queryFn: () => api<CrewMemberSummary[]>('/users/crew'), staleTime: 60_000 });
  const create = useCreateRun();
  const [serverErrors, setServerErrors] = useState<string[]>([]);
  const form = useForm({
    initialValues: {
      engineId: params.get('engine') ?? '',
      purpose: 'demonstration' as RunPurpose,
      title: '',
      plannedFor: '',
      notes: '',
      crewIds: [] as string[],
    },
    validate: {
      engineId: (v) => (v ? null : 'Choose the engine'),
      title: (v) => (v.trim() ? null : 'Give the run a title, e.g. “Open day, afternoon”'),
    },
  });

  // With one engine on site, choose it.
  const only = engines.data?.length === 1 ? engines.data[0]!.id : null;
  useEffect(() => {
    if (only && !form.values.engineId) form.setFieldValue('engineId', only);
    // eslint-disable-next-line react-hooks/exhaustive-deps -- form is new each render; choose the only engine once
  }, [only]);

  return (
    <Stack maw={720}>
      <PageHeader title="Plan a run" subtitle="A run is one day’s work of an engine, from the pre-start checks to the countersigned log." />
      {engines.isLoading && <Loader />}
      {engines.error && <Alert color="signal">{errorText(engines.error)}</Alert>}
      <Card withBorder padding="lg">
        <form
          onSubmit={form.onSubmit((v) => {
            setServerErrors([]);
            create.mutate(
              {
                engineId: v.engineId,
                purpose: v.purpose,
                title: v.title.trim(),
                plannedFor: v.plannedFor || null,
                notes: v.notes.trim() || undefined,
                crewIds: v.crewIds,
              },
              {
                onSuccess: (run) => {
                  notifications.show({ title: 'Run planned', message: `${run.title} on ${run.engineName}.` });
                  void navigate(`/runs/${run.id}`);
                },
                onError: (e) => setServerErrors(e instanceof HttpError ? e.messages : [errorText(e)]),
              },
            );
          })}
        >
          <Stack>
            {serverErrors.length > 0 && (
              <Alert color="signal" title="Not planned" role="alert">
                <List spacing={2}>
                  {serverErrors.map((m, i) => (
                    <List.Item key={i}>{m}</List.Item>
                  ))}
                </List>
              </Alert>
            )}
            <Select
              label="Engine"
              required
              allowDeselect={false}
              data={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
              {...form.getInputProps('engineId')}
            />
            <Select label="Purpose" required allowDeselect={false} data={purposeOptions} {...form.getInputProps('purpose')} />
            <TextInput label="Title" required placeholder="Open day, afternoon" {...form.getInputProps('title')} />
            <TextInput
              label="Planned for"
              type="date"
              description="The day of the run. Leave empty if it is not fixed yet."
              {...form.getInputProps('plannedFor')}
            />
            <MultiSelect
              label="Crew"
              description="Who works this run. Qualifications for each duty are checked when they sign and start."
              searchable
              data={(crew.data ?? [])
                .filter((c) => c.role !== 'observer')
                .map((c) => ({ value: c.id, label: `${c.displayName} (${ROLE_LABELS[c.role]})` }))}
              {...form.getInputProps('crewIds')}
            />
            <Textarea label="Notes" rows={3} {...form.getInputProps('notes')} />
            <Text fz="sm" c="dimmed">
              The run starts as planned. Preparing it opens the pre-start checklists; the engine can start only once they are signed.
            </Text>
            <Group justify="flex-end">
              <Button variant="default" size="lg" onClick={() => navigate('/runs')}>
                Cancel
              </Button>
              <Button type="submit" size="lg" loading={create.isPending}>
                Plan this run
              </Button>
            </Group>
          </Stack>
        </form>
      </Card>
    </Stack>
  );
}
