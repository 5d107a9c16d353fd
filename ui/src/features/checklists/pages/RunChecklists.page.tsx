import { useState } from 'react';
import { Link, useNavigate, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Center, Group, Loader, Paper, Progress, SimpleGrid, Stack, Text, Title } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconArrowLeft, IconCircleCheck, IconPencil, IconPlayerPlay, IconPrinter, IconRepeat } from '@tabler/icons-react';
import {
  CHECKLIST_PURPOSE_LABELS,
  CHECKLIST_RUN_STATES,
  DUTY_LABELS,
  RUN_STATE_LABELS,
  type ChecklistRequiredWhen,
  type ChecklistSummary,
  type RunChecklistTemplateStatus,
} from '@crankjournal/shared-types';
import { errorText, HttpError } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { runDetailQuery } from '../../runs/api/runs.api';
import { RunStateBadge } from '../../runs/components/RunStateBadge';
import { downloadBlankChecklist, runChecklistsQuery, useStartChecklist } from '../api/checklists.api';
import { GatePanel } from '../components/GatePanel';
import { useRunChecklistsLive } from '../model/useRunChecklistsLive';

const GROUPS: { when: ChecklistRequiredWhen; title: string; note: string }[] = [
  {
    when: 'before_start',
    title: 'Before the start',
    note: 'Required: the engine may not start until each is signed. Signing the last one clears the run to start.',
  },
  { when: 'not_required', title: 'Kept for the record', note: 'Not asked for by the start gate.' },
  { when: 'after_stop', title: 'After the stop', note: 'Required before the run can be closed.' },
];

const time = (iso: string) => new Date(iso).toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });

function ProgressLine({ c }: { c: ChecklistSummary }) {
  const pct = c.requiredItems ? (100 * c.requiredDone) / c.requiredItems : 100;
  return (
    <Stack gap={4}>
      <Progress
        value={pct}
        size="lg"
        radius="sm"
        color={c.blockedItems ? 'signal' : 'copper'}
        aria-label={`${c.requiredDone} of ${c.requiredItems} required items done`}
      />
      <Text fz="sm" c={c.blockedItems ? 'signal' : 'dimmed'}>
        {c.requiredDone} of {c.requiredItems} required items done
        {c.blockedItems ? ` · ${c.blockedItems} outside the acceptance range` : ''}
      </Text>
    </Stack>
  );
}

function TemplateCard({
  s,
  runId,
  canWrite,
  onStart,
  starting,
}: {
  s: RunChecklistTemplateStatus;
  runId: string;
  canWrite: boolean;
  onStart: () => void;
  starting: boolean;
}) {
  const t = s.template;
  const [printing, setPrinting] = useState(false);
  const print = async () => {
    setPrinting(true);
    try {
      await downloadBlankChecklist(t.id);
    } catch (e) {
      notifications.show({ color: 'signal', title: 'Not downloaded', message: errorText(e) });
    } finally {
      setPrinting(false);
    }
  };
  const again = t.purpose === 'pre_lube' ? 'Pre-lube again' : 'Fill again';
  return (
    <Paper withBorder p="md" radius="md" data-testid={`template-${t.name}`}>
      <Stack gap="sm">
        <Group justify="space-between" align="flex-start" wrap="nowrap">
          <Stack gap={2}>
            <Title order={3} fz={22}>
              {t.name}
            </Title>
            <Text fz="sm" c="dimmed">
              {t.name === CHECKLIST_PURPOSE_LABELS[t.purpose] ? '' : `${CHECKLIST_PURPOSE_LABELS[t.purpose]} · `}
              version {t.currentVersion} · the signer needs a {DUTY_LABELS[t.requiredDuty].toLowerCase()} qualification
            </Text>
          </Stack>
          {s.progress === 'signed' ? (
            <Badge
              size="lg"
              variant="outline"
              color="gray"
              style={{ flexShrink: 0 }}
              leftSection={<IconCircleCheck size={16} color="var(--mantine-color-copper-5)" />}
            >
              Signed
            </Badge>
          ) : s.progress === 'in_progress' ? (
            <Badge size="lg" variant="outline" color="gray" style={{ flexShrink: 0 }}>
              Being filled
            </Badge>
          ) : (
            <Badge size="lg" variant="outline" color="gray" style={{ flexShrink: 0 }}>
              Not started
            </Badge>
          )}
        </Group>
        {s.signed && (
          <Text fz="sm">
            Signed by <b>{s.signed.signedByName}</b> at {time(s.signed.signedAt!)} (version {s.signed.version})
            {s.signed.amendmentCount ? ` · ${s.signed.amendmentCount} amendment(s)` : ''}
          </Text>
        )}
        {s.open && <ProgressLine c={s.open} />}
        <Group gap="sm" wrap="wrap">
          {s.open ? (
            <Button component={Link} to={`/runs/${runId}/checklists/${s.open.id}`} size="lg" h={52} leftSection={<IconPencil />}>
              {canWrite ? 'Continue' : 'View'}
            </Button>
          ) : (
            canWrite &&
            s.fillableNow &&
            (s.signed ? (
              <Button size="lg" h={52} variant="default" leftSection={<IconRepeat />} onClick={onStart} loading={starting}>
                {again}
              </Button>
            ) : (
              <Button size="lg" h={52} leftSection={<IconPlayerPlay />} onClick={onStart} loading={starting}>
                Start checklist
              </Button>
            ))
          )}
          {s.signed && (
            <Button component={Link} to={`/runs/${runId}/checklists/${s.signed.id}`} size="lg" h={52} variant="default">
              View signed
            </Button>
          )}
          <Button size="lg" h={52} variant="subtle" leftSection={<IconPrinter />} onClick={() => void print()} loading={printing}>
            Blank PDF
          </Button>
        </Group>
        {!s.fillableNow && !s.open && !s.signed && (
          <Text fz="sm" c="dimmed">
            Filled while the run is {CHECKLIST_RUN_STATES[t.requiredWhen].map((x) => RUN_STATE_LABELS[x].toLowerCase()).join(' or ')}.
          </Text>
        )}
      </Stack>
    </Paper>
  );
}

/** A run's checklists on the tablet: /runs/:id/checklists. */
export default function RunChecklistsPage() {
  const { id = '' } = useParams();
  const navigate = useNavigate();
  const canWrite = useHasRole('operator', 'chief_engineer');
  const run = useQuery(runDetailQuery(id));
  const overview = useQuery(runChecklistsQuery(id));
  const startChecklist = useStartChecklist(id);
  useRunChecklistsLive(id);

  if (run.isLoading || overview.isLoading)
    return (
      <Center h={240}>
        <Loader />
      </Center>
    );
  if (run.error || overview.error || !run.data || !overview.data)
    return (
      <Alert color="signal" title="Cannot open this run's checklists">
        {errorText(run.error ?? overview.error)}
      </Alert>
    );

  const r = run.data;
  const o = overview.data;
  const finished = r.state === 'closed' || r.state === 'abandoned';
  const start = (templateId: string) =>
    startChecklist.mutate(templateId, {
      onSuccess: (c) => void navigate(`/runs/${id}/checklists/${c.id}`),
      onError: (e) => {
        const existing = e instanceof HttpError ? (e.body?.details as { checklistId?: string } | undefined)?.checklistId : undefined;
        if (existing) void navigate(`/runs/${id}/checklists/${existing}`);
        else notifications.show({ color: 'signal', title: 'Not started', message: errorText(e) });
      },
    });

  const older = o.checklists.filter((c) => !o.templates.some((t) => t.signed?.id === c.id || t.open?.id === c.id));

  return (
    <>
      <Anchor component={Link} to={`/runs/${id}`} fz="sm" mb="xs" display="inline-flex" style={{ alignItems: 'center', gap: 4 }}>
        <IconArrowLeft size={16} /> Back to the run
      </Anchor>
      <PageHeader
        title={`Checklists — ${r.title}`}
        subtitle={`${r.engineName} · pre-lube window ${o.preLubeFreshnessMinutes} min`}
        state={<RunStateBadge state={r.state} />}
      />
      <GatePanel run={r} overview={o} />
      {finished && (
        <Text c="dimmed" mb="md">
          This run is {RUN_STATE_LABELS[r.state].toLowerCase()}: its checklists are part of the record and read-only.
        </Text>
      )}
      {o.templates.length === 0 && (
        <Alert color="gray" variant="outline" mb="md">
          {r.engineName} has no issued checklist templates yet. The chief engineer writes them under Checklists.
        </Alert>
      )}
      <Stack gap="xl">
        {GROUPS.map((g) => {
          const list = o.templates.filter((t) => t.template.requiredWhen === g.when);
          if (!list.length) return null;
          return (
            <Stack key={g.when} gap="sm">
              <div>
                <Title order={2} fz={22}>
                  {g.title}
                </Title>
                <Text fz="sm" c="dimmed">
                  {g.note}
                </Text>
              </div>
              <SimpleGrid cols={{ base: 1, md: 2 }} spacing="md">
                {list.map((s) => (
                  <TemplateCard
                    key={s.template.id}
                    s={s}
                    runId={id}
                    canWrite={canWrite && !finished}
                    starting={startChecklist.isPending && startChecklist.variables === s.template.id}
                    onStart={() => start(s.template.id)}
                  />
                ))}
              </SimpleGrid>
            </Stack>
          );
        })}
        {older.length > 0 && (
          <Stack gap="xs">
            <Title order={2} fz={20}>
              Earlier checklists of this run
            </Title>
            {older.map((c) => (
              <Group key={c.id} gap="sm">
                <Anchor component={Link} to={`/runs/${id}/checklists/${c.id}`}>
                  {c.name} (version {c.version})
                </Anchor>
                <Text fz="sm" c="dimmed">
                  {c.status === 'signed'
                    ? `signed by ${c.signedByName} at ${time(c.signedAt!)}`
                    : `started by ${c.startedByName} at ${time(c.startedAt)}, not signed`}
                </Text>
              </Group>
            ))}
          </Stack>
        )}
      </Stack>
    </>
  );
}
