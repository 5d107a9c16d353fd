import { useMemo, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Center, Group, Loader, Progress, Stack, Text, Title } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconArrowLeft, IconCircleCheck, IconCloudOff, IconLock, IconSignature } from '@tabler/icons-react';
import { CHECKLIST_RUN_STATES, DUTY_LABELS, RUN_STATE_LABELS, type ChecklistItemDef } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useOutbox } from '../../../api/useOutbox';
import { SAFETY_NOTE } from '../../../components/Caution/Caution';
import { useHasRole } from '../../auth/useSession';
import { BottomBar } from '../../runs/live/BottomBar';
import { checklistQuery, useChecklistAction, type ChecklistAction } from '../api/checklists.api';
import { ItemCard, type ItemMode } from '../components/ItemCard';
import { AmendModal, OverrideModal, SignModal } from '../components/ChecklistModals';
import { useRunChecklistsLive } from '../model/useRunChecklistsLive';

const when = (iso: string) =>
  new Date(iso).toLocaleString(undefined, { day: 'numeric', month: 'short', hour: '2-digit', minute: '2-digit' });

/** One checklist on the tablet: /runs/:id/checklists/:checklistId. Items in any order, progress, cautions, signature. */
export default function ChecklistPage() {
  const { id: runId = '', checklistId = '' } = useParams();
  const canWrite = useHasRole('operator', 'chief_engineer');
  const isChief = useHasRole('chief_engineer');
  const q = useQuery(checklistQuery(checklistId));
  const action = useChecklistAction(checklistId, runId, q.data?.name);
  const box = useOutbox(runId);
  // Entries and photos of this checklist kept on the tablet, by item, in the order they were made.
  const waiting = useMemo(() => {
    const m = new Map<string, string[]>();
    for (const p of box.pending)
      if (p.ref?.checklistId === checklistId && p.ref.itemKey)
        m.set(p.ref.itemKey, [...(m.get(p.ref.itemKey) ?? []), p.kind === 'checklist-photo' ? 'a photo' : 'an entry']);
    return m;
  }, [box.pending, checklistId]);
  const signWaiting = box.pending.find((p) => p.kind === 'checklist-sign' && p.ref?.checklistId === checklistId);
  const [signing, setSigning] = useState(false);
  const [overriding, setOverriding] = useState<ChecklistItemDef | null>(null);
  const [amending, setAmending] = useState<ChecklistItemDef | null>(null);
  useRunChecklistsLive(runId);

  const entries = useMemo(() => new Map((q.data?.entries ?? []).map((e) => [e.itemKey, e])), [q.data]);

  if (q.isLoading)
    return (
      <Center h={240}>
        <Loader />
      </Center>
    );
  if (q.error || !q.data)
    return (
      <Alert color="signal" title="Cannot open this checklist">
        {errorText(q.error)}
      </Alert>
    );
  const c = q.data;
  const signed = c.status === 'signed';
  const runOpen = c.runState !== 'closed' && c.runState !== 'abandoned';
  const fillable = CHECKLIST_RUN_STATES[c.requiredWhen].includes(c.runState);
  const mode: ItemMode = !canWrite || !runOpen ? 'readonly' : signed ? 'signed' : fillable ? 'fill' : 'readonly';
  const pending = (a: ChecklistAction['kind'], key?: string) =>
    action.isPending &&
    action.variables?.kind === a &&
    (key === undefined || ('itemKey' in action.variables && action.variables.itemKey === key));

  const run = (a: ChecklistAction & { itemLabel?: string }, done?: () => void, what = 'Not saved') =>
    action.mutate(a, {
      onSuccess: (r) => {
        if (r !== null) return done?.();
        notifications.show({
          color: 'amber',
          icon: <IconCloudOff size={18} />,
          title: a.kind === 'sign' ? 'No connection — signature kept on this tablet' : 'No connection — kept on this tablet',
          message:
            a.kind === 'sign'
              ? 'It is sent after the entries before it; the start gate counts it once the server has confirmed it.'
              : 'It is sent in order as soon as the server answers; the checklist counts it once the server has it.',
        });
        if (a.kind === 'sign') setSigning(false);
      },
      onError: (e) => {
        if (a.kind === 'sign' || a.kind === 'override' || a.kind === 'amend') return; // shown in the modal
        notifications.show({ color: 'signal', title: what, message: errorText(e) });
      },
    });

  // Required items done on the tablet but not yet on the server count here; the server checks again when the signature arrives.
  const waitingRequired = c.sections
    .flatMap((s) => s.items)
    .filter((it) => it.required && !entries.get(it.key)?.done && waiting.has(it.key)).length;
  const missing = c.requiredItems - c.requiredDone - waitingRequired;
  const ready = missing === 0 && c.blockedItems === 0;
  const why =
    missing > 0
      ? `${missing} required item${missing === 1 ? '' : 's'} still to do`
      : c.blockedItems > 0
        ? `${c.blockedItems} outside the acceptance range`
        : '';
  const pct = c.requiredItems ? (100 * c.requiredDone) / c.requiredItems : 100;

  return (
    <>
      <Anchor
        component={Link}
        to={`/runs/${runId}/checklists`}
        fz="sm"
        mb="xs"
        display="inline-flex"
        style={{ alignItems: 'center', gap: 4 }}
      >
        <IconArrowLeft size={16} /> All checklists of this run
      </Anchor>
      <Group justify="space-between" align="flex-start" mb="sm" wrap="wrap">
        <Stack gap={2}>
          <Group gap="sm">
            {signed && <IconLock size={22} aria-hidden />}
            <Title order={1} fz={28}>
              {c.name}
            </Title>
            <Badge size="lg" variant="outline" color="gray">
              Version {c.version}
            </Badge>
            {signed ? (
              <Badge
                size="lg"
                variant="outline"
                color="gray"
                leftSection={<IconCircleCheck size={16} color="var(--mantine-color-copper-5)" />}
              >
                Signed
              </Badge>
            ) : (
              <Badge size="lg" variant="outline" color="gray">
                Being filled
              </Badge>
            )}
          </Group>
          <Text c="dimmed" fz="sm">
            Started by {c.startedByName}, {when(c.startedAt)} · the signer needs a current {DUTY_LABELS[c.requiredDuty].toLowerCase()}{' '}
            qualification
          </Text>
        </Stack>
      </Group>
      {signed && (
        <Group gap="xs" mb="md" data-testid="signature" wrap="nowrap" align="flex-start">
          <IconCircleCheck size={22} color="var(--mantine-color-copper-5)" aria-hidden style={{ flex: 'none', marginTop: 3 }} />
          <Text>
            Signed by <b>{c.signedByName}</b>{' '}
            {c.signedOnDeviceAt
              ? `on the tablet at ${when(c.signedOnDeviceAt)}, confirmed by the server at ${when(c.signedAt!)},`
              : `on ${when(c.signedAt!)}`}{' '}
            against version {c.version}. Read-only
            {c.amendmentCount
              ? `; ${c.amendmentCount} amendment(s) recorded below.`
              : '; a mistake is corrected by an amendment with a reason.'}
          </Text>
        </Group>
      )}
      {!signed && signWaiting && (
        <Alert color="amber" variant="outline" mb="md" icon={<IconCloudOff />} data-testid="signature-waiting">
          Signed on the tablet at {when(String(signWaiting.body && (signWaiting.body as { signedOnDeviceAt?: string }).signedOnDeviceAt))}
          {signWaiting.userName ? ` by ${signWaiting.userName}` : ''}; not yet confirmed by the server. The start gate counts it once the
          server has it.
        </Alert>
      )}
      {!signed && (
        <Stack gap={4} mb="md" data-testid="checklist-progress">
          <Progress value={pct} size="xl" radius="sm" color={c.blockedItems ? 'signal' : 'copper'} aria-label="Progress" />
          <Text fz="md" fw={600} c={c.blockedItems ? 'signal' : undefined}>
            {c.requiredDone} of {c.requiredItems} required items done
            {c.blockedItems ? ` · ${c.blockedItems} outside the acceptance range` : ''}
          </Text>
        </Stack>
      )}
      {!signed && !fillable && runOpen && (
        <Alert color="gray" variant="outline" mb="md">
          This checklist is filled while the run is{' '}
          {CHECKLIST_RUN_STATES[c.requiredWhen].map((s) => RUN_STATE_LABELS[s].toLowerCase()).join(' or ')}; the run is{' '}
          {RUN_STATE_LABELS[c.runState].toLowerCase()}.
        </Alert>
      )}
      {c.description && (
        <Text mb="md" maw={900}>
          {c.description}
        </Text>
      )}
      <Stack gap="xl">
        {c.sections.map((s) => (
          <Stack key={s.key} gap="sm">
            <Title order={2} fz={22}>
              {s.title}
            </Title>
            {s.items.map((it) => (
              <ItemCard
                key={it.key}
                checklistId={c.id}
                item={it}
                entry={entries.get(it.key)}
                mode={mode}
                busy={pending('fill', it.key) || pending('photo', it.key)}
                canOverride={isChief}
                canAmend={canWrite && runOpen}
                waiting={waiting.get(it.key)}
                onFill={(value) => run({ kind: 'fill', itemKey: it.key, value, itemLabel: it.label })}
                onPhoto={(file) => run({ kind: 'photo', itemKey: it.key, file, itemLabel: it.label }, undefined, 'Photo not saved')}
                onOverride={() => {
                  action.reset();
                  setOverriding(it);
                }}
                onAmend={() => {
                  action.reset();
                  setAmending(it);
                }}
              />
            ))}
          </Stack>
        ))}
        <Text fz="xs" c="dimmed">
          {SAFETY_NOTE}
        </Text>
      </Stack>

      <SignModal
        checklist={c}
        opened={signing}
        onClose={() => setSigning(false)}
        busy={pending('sign')}
        error={action.error && action.variables?.kind === 'sign' ? errorText(action.error) : null}
        onSign={(signature) =>
          run({ kind: 'sign', signature }, () => {
            setSigning(false);
            notifications.show({ color: 'copper', title: 'Signed', message: `${c.name} is signed.` });
          })
        }
      />
      <OverrideModal
        item={overriding}
        entry={overriding ? entries.get(overriding.key) : undefined}
        onClose={() => setOverriding(null)}
        busy={pending('override')}
        error={action.error && action.variables?.kind === 'override' ? errorText(action.error) : null}
        onOverride={(reason) => run({ kind: 'override', itemKey: overriding!.key, reason }, () => setOverriding(null))}
      />
      <AmendModal
        item={amending}
        entry={amending ? entries.get(amending.key) : undefined}
        isChief={isChief}
        onClose={() => setAmending(null)}
        busy={pending('amend')}
        error={action.error && action.variables?.kind === 'amend' ? errorText(action.error) : null}
        onAmend={(request) => run({ kind: 'amend', request }, () => setAmending(null))}
      />

      <BottomBar label="Checklist actions">
        <Text fz="md" fw={600} c={!signed && c.blockedItems ? 'signal' : undefined}>
          {signed ? `Signed by ${c.signedByName}` : `${c.requiredDone} of ${c.requiredItems} done${why ? ` · ${why}` : ' · ready to sign'}`}
        </Text>
        {mode === 'fill' ? (
          <Button
            size="xl"
            h={60}
            leftSection={<IconSignature />}
            disabled={!ready || !!signWaiting}
            onClick={() => {
              action.reset();
              setSigning(true);
            }}
          >
            Sign checklist
          </Button>
        ) : (
          <Button component={Link} to={`/runs/${runId}/checklists`} size="xl" h={60} variant="default">
            Back to the run’s checklists
          </Button>
        )}
      </BottomBar>
    </>
  );
}
