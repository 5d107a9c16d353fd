import { useEffect, useState } from 'react';
import { Link, useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  ActionIcon,
  Alert,
  Anchor,
  Button,
  Center,
  Grid,
  Group,
  List,
  Loader,
  Modal,
  MultiSelect,
  NumberInput,
  Paper,
  Select,
  Stack,
  Switch,
  TagsInput,
  Text,
  Textarea,
  TextInput,
  Title,
} from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconArrowDown, IconArrowLeft, IconArrowUp, IconPlus, IconTrash } from '@tabler/icons-react';
import {
  CHECKLIST_TEMPLATE_WORDS,
  CHECKLIST_ITEM_KIND_LABELS,
  CHECKLIST_ITEM_KINDS,
  CHECKLIST_PURPOSE_LABELS,
  CHECKLIST_PURPOSES,
  CHECKLIST_REQUIRED_WHEN,
  CHECKLIST_REQUIRED_WHEN_LABELS,
  DUTIES,
  DUTY_LABELS,
  HAZARD_LABELS,
  HAZARDS,
  type ChecklistItemDef,
  type ChecklistItemKind,
  type ChecklistPurpose,
  type ChecklistRequiredWhen,
  type ChecklistSectionDef,
  type ChecklistTemplateContent,
  type Duty,
  type Hazard,
} from '@crankjournal/shared-types';
import { errorText, HttpError } from '../../../api/http';
import { SAFETY_NOTE } from '../../../components/Caution/Caution';
import { BottomBar } from '../../runs/live/BottomBar';
import { templateQuery, useTemplateWrite } from '../api/checklists.api';

/** A key for a new section or item: letters of its text and a short random tail, stable once saved. */
export function newKey(text: string): string {
  const slug = text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '')
    .slice(0, 40);
  return `${slug || 'item'}-${Math.random().toString(36).slice(2, 6)}`;
}

const blankItem = (): ChecklistItemDef => ({ key: newKey('item'), kind: 'tick', label: '', required: true, caution: null });
const blankSection = (): ChecklistSectionDef => ({ key: newKey('section'), title: '', items: [blankItem()] });
const BLANK: ChecklistTemplateContent = {
  name: '',
  purpose: 'pre_start_inspection',
  requiredWhen: 'before_start',
  requiredDuty: 'start_and_run',
  description: '',
  sections: [blankSection()],
};

const options = <T extends string>(list: readonly T[], labels: Record<T, string>) => list.map((v) => ({ value: v, label: labels[v] }));

function move<T>(list: T[], i: number, by: number): T[] {
  const j = i + by;
  if (j < 0 || j >= list.length) return list;
  const next = [...list];
  [next[i], next[j]] = [next[j], next[i]];
  return next;
}

/** Only the fields an item of its kind carries (what the server accepts). */
function tidy(it: ChecklistItemDef): ChecklistItemDef {
  const base: ChecklistItemDef = {
    key: it.key,
    kind: it.kind,
    label: it.label,
    required: it.required,
    caution: it.caution?.text.trim() ? it.caution : null,
  };
  if (it.help?.trim()) base.help = it.help;
  if (it.kind === 'reading') Object.assign(base, { unit: it.unit ?? '', min: it.min ?? null, max: it.max ?? null });
  if (it.kind === 'choice')
    Object.assign(base, { choices: it.choices ?? [], acceptable: (it.acceptable ?? []).filter((a) => (it.choices ?? []).includes(a)) });
  return base;
}
const tidyContent = (c: ChecklistTemplateContent): ChecklistTemplateContent => ({
  ...c,
  sections: c.sections.map((s) => ({ ...s, items: s.items.map(tidy) })),
});

function ItemEditor({
  item,
  onChange,
  onMove,
  onRemove,
  first,
  last,
}: {
  item: ChecklistItemDef;
  onChange: (it: ChecklistItemDef) => void;
  onMove: (by: number) => void;
  onRemove: () => void;
  first: boolean;
  last: boolean;
}) {
  const set = (p: Partial<ChecklistItemDef>) => onChange({ ...item, ...p });
  return (
    <Paper withBorder p="sm" radius="sm">
      <Stack gap="xs">
        <Group gap="sm" align="flex-end" wrap="nowrap">
          <TextInput
            label="What to do or read"
            style={{ flex: 1 }}
            value={item.label}
            onChange={(e) => set({ label: e.currentTarget.value })}
            required
          />
          <Group gap={4} wrap="nowrap">
            <ActionIcon variant="default" aria-label="Move item up" disabled={first} onClick={() => onMove(-1)}>
              <IconArrowUp />
            </ActionIcon>
            <ActionIcon variant="default" aria-label="Move item down" disabled={last} onClick={() => onMove(1)}>
              <IconArrowDown />
            </ActionIcon>
            <ActionIcon variant="subtle" color="signal" aria-label="Remove item" onClick={onRemove}>
              <IconTrash />
            </ActionIcon>
          </Group>
        </Group>
        <Group gap="sm" align="flex-end" wrap="nowrap">
          <Select
            label="Kind"
            w={240}
            data={options(CHECKLIST_ITEM_KINDS, CHECKLIST_ITEM_KIND_LABELS)}
            value={item.kind}
            onChange={(v) => v && set({ kind: v as ChecklistItemKind })}
            allowDeselect={false}
          />
          <TextInput
            label="How (optional)"
            style={{ flex: 1 }}
            value={item.help ?? ''}
            onChange={(e) => set({ help: e.currentTarget.value })}
          />
          <Switch label="Required" checked={item.required} onChange={(e) => set({ required: e.currentTarget.checked })} mb={10} size="md" />
        </Group>
        {item.kind === 'reading' && (
          <Group gap="sm">
            <TextInput
              label="Unit"
              w={140}
              placeholder="psig, degF, in, min"
              value={item.unit ?? ''}
              onChange={(e) => set({ unit: e.currentTarget.value })}
              required
            />
            <NumberInput
              label="Acceptable from"
              w={170}
              value={item.min ?? ''}
              onChange={(v) => set({ min: v === '' ? null : Number(v) })}
              hideControls
            />
            <NumberInput
              label="Acceptable up to"
              w={170}
              value={item.max ?? ''}
              onChange={(v) => set({ max: v === '' ? null : Number(v) })}
              hideControls
            />
          </Group>
        )}
        {item.kind === 'choice' && (
          <Grid>
            <Grid.Col span={{ base: 12, sm: 6 }}>
              <TagsInput
                label="Options"
                description="Type an option and press Enter"
                value={item.choices ?? []}
                onChange={(v) => set({ choices: v })}
              />
            </Grid.Col>
            <Grid.Col span={{ base: 12, sm: 6 }}>
              <MultiSelect
                label="Acceptable options"
                description="Others block the signature"
                data={item.choices ?? []}
                value={(item.acceptable ?? []).filter((a) => (item.choices ?? []).includes(a))}
                onChange={(v) => set({ acceptable: v })}
              />
            </Grid.Col>
          </Grid>
        )}
        <Group gap="sm" align="flex-start">
          <Select
            label="Caution"
            w={200}
            data={[{ value: '', label: 'None' }, ...options(HAZARDS, HAZARD_LABELS)]}
            value={item.caution?.hazard ?? ''}
            onChange={(v) => set({ caution: v ? { hazard: v as Hazard, text: item.caution?.text ?? '' } : null })}
            allowDeselect={false}
          />
          {item.caution && (
            <Textarea
              label="Caution text (shown beside the item)"
              style={{ flex: 1 }}
              autosize
              minRows={1}
              value={item.caution.text}
              onChange={(e) => set({ caution: { hazard: item.caution!.hazard, text: e.currentTarget.value } })}
            />
          )}
        </Group>
      </Stack>
    </Paper>
  );
}

/** The chief engineer's template editor: /checklists/templates/new?engineId=… and /checklists/templates/:id/edit. */
export default function TemplateEditorPage() {
  const { id } = useParams();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const existing = useQuery({ ...templateQuery(id ?? ''), enabled: !!id });
  const write = useTemplateWrite();
  const [content, setContent] = useState<ChecklistTemplateContent | null>(id ? null : BLANK);
  const [dirty, setDirty] = useState(false);
  const [errors, setErrors] = useState<string[]>([]);
  const [issuing, setIssuing] = useState(false);
  const [note, setNote] = useState('');

  useEffect(() => {
    if (id && existing.data && !content) setContent(structuredClone(existing.data.draft ?? existing.data.current?.content ?? BLANK));
  }, [id, existing.data, content]);

  if (id && existing.isLoading)
    return (
      <Center h={240}>
        <Loader />
      </Center>
    );
  if (id && (existing.error || !existing.data)) return <Alert color="signal">{errorText(existing.error)}</Alert>;
  if (!content) return <Loader />;
  const engineId = existing.data?.engineId ?? params.get('engineId') ?? '';
  const nextVersion = (existing.data?.currentVersion ?? 0) + 1;

  const update = (c: ChecklistTemplateContent) => {
    setContent(c);
    setDirty(true);
  };
  const setSection = (i: number, s: ChecklistSectionDef) =>
    update({ ...content, sections: content.sections.map((x, j) => (j === i ? s : x)) });
  const fail = (e: unknown) => setErrors(e instanceof HttpError ? e.messages : [errorText(e)]);

  const saveDraft = (then?: (id: string) => void) => {
    setErrors([]);
    const body = tidyContent(content);
    if (!id) {
      write.create.mutate(
        { ...body, engineId, issue: false },
        {
          onSuccess: (t) => {
            setDirty(false);
            notifications.show({ title: 'Saved, in preparation', message: `${t.name}: not issued yet.` });
            void navigate(`/checklists/templates/${t.id}/edit`, { replace: true });
            then?.(t.id);
          },
          onError: fail,
        },
      );
      return;
    }
    write.saveDraft.mutate(
      { id, content: body },
      {
        onSuccess: () => {
          setDirty(false);
          if (then) then(id);
          else notifications.show({ title: 'Revision saved', message: 'Not issued yet: checklists still use the version in issue.' });
        },
        onError: fail,
      },
    );
  };
  const issue = () => {
    const go = (tid: string) =>
      write.issue.mutate(
        { id: tid, changeNote: note },
        {
          onSuccess: (t) => {
            setIssuing(false);
            notifications.show({
              title: `Version ${t.currentVersion} issued`,
              message: 'New checklists use it; completed ones keep theirs.',
            });
            void navigate(`/checklists/templates/${t.id}`);
          },
          onError: (e) => {
            setIssuing(false);
            fail(e);
          },
        },
      );
    if (!id || dirty || !existing.data?.hasDraft) saveDraft(go);
    else go(id);
  };
  const busy = write.create.isPending || write.saveDraft.isPending || write.issue.isPending;

  return (
    <>
      <Anchor
        component={Link}
        to={id ? `/checklists/templates/${id}` : '/checklists'}
        fz="sm"
        mb="xs"
        display="inline-flex"
        style={{ alignItems: 'center', gap: 4 }}
      >
        <IconArrowLeft size={16} /> {id ? 'Back to the template' : 'All checklists'}
      </Anchor>
      <Title order={1} fz={28} mb="xs">
        {id ? `Edit “${existing.data?.name}”` : 'New checklist template'}
      </Title>
      <Text c="dimmed" mb="md">
        Changes stay in preparation until you issue them as version {nextVersion}. Checklists already filled keep the version they were
        filled against.
      </Text>
      {errors.length > 0 && (
        <Alert color="signal" title="Not saved" mb="md" role="alert">
          <List size="sm">
            {errors.map((e) => (
              <List.Item key={e}>{e}</List.Item>
            ))}
          </List>
        </Alert>
      )}
      <Stack gap="md">
        <Grid>
          <Grid.Col span={{ base: 12, sm: 6 }}>
            <TextInput label="Name" required value={content.name} onChange={(e) => update({ ...content, name: e.currentTarget.value })} />
          </Grid.Col>
          <Grid.Col span={{ base: 12, sm: 6 }}>
            <Select
              label="Purpose"
              data={options(CHECKLIST_PURPOSES, CHECKLIST_PURPOSE_LABELS)}
              value={content.purpose}
              onChange={(v) => v && update({ ...content, purpose: v as ChecklistPurpose })}
              allowDeselect={false}
            />
          </Grid.Col>
          <Grid.Col span={{ base: 12, sm: 6 }}>
            <Select
              label="When it is required"
              data={options(CHECKLIST_REQUIRED_WHEN, CHECKLIST_REQUIRED_WHEN_LABELS)}
              value={content.requiredWhen}
              onChange={(v) => v && update({ ...content, requiredWhen: v as ChecklistRequiredWhen })}
              allowDeselect={false}
            />
          </Grid.Col>
          <Grid.Col span={{ base: 12, sm: 6 }}>
            <Select
              label="Qualification the signer must hold"
              data={options(DUTIES, DUTY_LABELS)}
              value={content.requiredDuty}
              onChange={(v) => v && update({ ...content, requiredDuty: v as Duty })}
              allowDeselect={false}
            />
          </Grid.Col>
        </Grid>
        {content.purpose === 'pre_lube' && content.requiredWhen === 'before_start' && (
          <Text fz="sm" c="dimmed">
            The signature of this checklist starts the engine's pre-lube window; the start gate refuses once it has passed.
          </Text>
        )}
        <Textarea
          label="Description"
          autosize
          minRows={2}
          value={content.description}
          onChange={(e) => update({ ...content, description: e.currentTarget.value })}
        />
        {content.sections.map((s, si) => (
          <Paper key={s.key} withBorder p="md" radius="md">
            <Stack gap="sm">
              <Group gap="sm" align="flex-end" wrap="nowrap">
                <TextInput
                  label={`Section ${si + 1}`}
                  style={{ flex: 1 }}
                  value={s.title}
                  onChange={(e) => setSection(si, { ...s, title: e.currentTarget.value })}
                  required
                />
                <ActionIcon
                  variant="default"
                  aria-label="Move section up"
                  disabled={si === 0}
                  onClick={() => update({ ...content, sections: move(content.sections, si, -1) })}
                >
                  <IconArrowUp />
                </ActionIcon>
                <ActionIcon
                  variant="default"
                  aria-label="Move section down"
                  disabled={si === content.sections.length - 1}
                  onClick={() => update({ ...content, sections: move(content.sections, si, 1) })}
                >
                  <IconArrowDown />
                </ActionIcon>
                <ActionIcon
                  variant="subtle"
                  color="signal"
                  aria-label="Remove section"
                  disabled={content.sections.length === 1}
                  onClick={() => update({ ...content, sections: content.sections.filter((_, j) => j !== si) })}
                >
                  <IconTrash />
                </ActionIcon>
              </Group>
              {s.items.map((it, ii) => (
                <ItemEditor
                  key={it.key}
                  item={it}
                  first={ii === 0}
                  last={ii === s.items.length - 1}
                  onChange={(n) => setSection(si, { ...s, items: s.items.map((x, j) => (j === ii ? n : x)) })}
                  onMove={(by) => setSection(si, { ...s, items: move(s.items, ii, by) })}
                  onRemove={() => setSection(si, { ...s, items: s.items.filter((_, j) => j !== ii) })}
                />
              ))}
              <Button
                variant="default"
                leftSection={<IconPlus />}
                w="fit-content"
                onClick={() => setSection(si, { ...s, items: [...s.items, blankItem()] })}
              >
                Add item
              </Button>
            </Stack>
          </Paper>
        ))}
        <Button
          variant="default"
          leftSection={<IconPlus />}
          w="fit-content"
          onClick={() => update({ ...content, sections: [...content.sections, blankSection()] })}
        >
          Add section
        </Button>
        <Text fz="xs" c="dimmed">
          Cautions sit beside their items on the tablet and the paper copy. {SAFETY_NOTE}
        </Text>
      </Stack>

      <Modal
        opened={issuing}
        onClose={() => setIssuing(false)}
        title={
          <Text fw={700} fz="lg">
            {CHECKLIST_TEMPLATE_WORDS.issue} version {nextVersion}?
          </Text>
        }
        centered
        size="lg"
      >
        <Stack>
          <Text fz="sm">
            New checklists use version {nextVersion} from now on. Checklists already filled, signed or being filled keep the version they
            started with.
          </Text>
          <Textarea
            label="What changed (for the record)"
            autosize
            minRows={2}
            value={note}
            onChange={(e) => setNote(e.currentTarget.value)}
            data-autofocus
          />
          <Group justify="flex-end">
            <Button variant="default" size="lg" onClick={() => setIssuing(false)}>
              Cancel
            </Button>
            <Button size="lg" loading={busy} onClick={issue}>
              {CHECKLIST_TEMPLATE_WORDS.issue} version {nextVersion}
            </Button>
          </Group>
        </Stack>
      </Modal>

      <BottomBar label="Template actions">
        <Group gap="sm">
          {id && existing.data?.hasDraft && existing.data.currentVersion > 0 && (
            <Button
              variant="subtle"
              color="signal"
              size="lg"
              onClick={() =>
                write.discardDraft.mutate(id, {
                  onSuccess: (t) => {
                    setContent(structuredClone(t.current!.content));
                    setDirty(false);
                  },
                  onError: fail,
                })
              }
            >
              Discard the revision
            </Button>
          )}
          <Text fz="sm" c="dimmed">
            {dirty ? 'Unsaved changes' : existing.data?.hasDraft ? `${CHECKLIST_TEMPLATE_WORDS.revision}: saved, not issued` : ''}
          </Text>
        </Group>
        <Group gap="sm" wrap="nowrap">
          <Button
            variant="default"
            size="lg"
            h={56}
            loading={write.create.isPending || write.saveDraft.isPending}
            onClick={() => saveDraft()}
            disabled={!dirty && !!id}
          >
            Save, keep in preparation
          </Button>
          <Button size="xl" h={60} onClick={() => setIssuing(true)} disabled={busy || (!!id && !dirty && !existing.data?.hasDraft)}>
            {CHECKLIST_TEMPLATE_WORDS.issue} version {nextVersion}
          </Button>
        </Group>
      </BottomBar>
    </>
  );
}
