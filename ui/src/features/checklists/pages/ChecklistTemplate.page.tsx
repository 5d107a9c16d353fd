import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Center, Grid, Group, Loader, Paper, Select, Stack, Table, Text, Title } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconArrowLeft, IconPencil, IconPrinter } from '@tabler/icons-react';
import {
  CHECKLIST_TEMPLATE_STATE_WORDS,
  CHECKLIST_TEMPLATE_WORDS,
  acceptanceRangeText,
  CHECKLIST_ITEM_KIND_LABELS,
  CHECKLIST_PURPOSE_LABELS,
  CHECKLIST_REQUIRED_WHEN_LABELS,
  DUTY_LABELS,
  HAZARD_LABELS,
  type ChecklistTemplateContent,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { Caution } from '../../../components/Caution/Caution';
import { PageHeader } from '../../../components/PageHeader';
import { useHasRole } from '../../auth/useSession';
import { downloadBlankChecklist, templateQuery, templateVersionQuery, useTemplateWrite } from '../api/checklists.api';

/** A version's content, read-only: sections, items with their kind, range or options, and cautions beside them. */
export function TemplateContentView({ content }: { content: ChecklistTemplateContent }) {
  return (
    <Stack gap="lg">
      {content.description && <Text>{content.description}</Text>}
      {content.sections.map((s) => (
        <Stack key={s.key} gap="xs">
          <Title order={3} fz={20}>
            {s.title}
          </Title>
          {s.items.map((it) => (
            <Paper key={it.key} withBorder p="sm" radius="sm">
              <Grid gap="md">
                <Grid.Col span={{ base: 12, sm: it.caution ? 7 : 12 }}>
                  <Text fw={600}>
                    {it.label}
                    {!it.required && (
                      <Text span c="dimmed" fw={400}>
                        {' '}
                        (optional)
                      </Text>
                    )}
                  </Text>
                  <Text fz="sm" c="dimmed">
                    {CHECKLIST_ITEM_KIND_LABELS[it.kind]}
                    {it.kind === 'reading' && acceptanceRangeText(it) ? ` · acceptance range ${acceptanceRangeText(it)}` : ''}
                    {it.kind === 'choice'
                      ? ` · ${(it.choices ?? []).join(' / ')}${it.acceptable?.length ? ` (acceptable: ${it.acceptable.join(', ')})` : ''}`
                      : ''}
                  </Text>
                  {it.help && <Text fz="sm">{it.help}</Text>}
                </Grid.Col>
                {it.caution && (
                  <Grid.Col span={{ base: 12, sm: 5 }}>
                    <Caution title={`Caution — ${HAZARD_LABELS[it.caution.hazard]}`}>
                      <Text fz="sm">{it.caution.text}</Text>
                    </Caution>
                  </Grid.Col>
                )}
              </Grid>
            </Paper>
          ))}
        </Stack>
      ))}
    </Stack>
  );
}

/** A template with its versions: /checklists/templates/:id. */
export default function ChecklistTemplatePage() {
  const { id = '' } = useParams();
  const isChief = useHasRole('chief_engineer');
  const t = useQuery(templateQuery(id));
  const [version, setVersion] = useState<number | null>(null);
  const shown = version ?? t.data?.currentVersion ?? 0;
  const v = useQuery({ ...templateVersionQuery(id, shown), enabled: shown > 0 && shown !== t.data?.currentVersion });
  const write = useTemplateWrite();
  const [printing, setPrinting] = useState(false);

  if (t.isLoading)
    return (
      <Center h={240}>
        <Loader />
      </Center>
    );
  if (t.error || !t.data)
    return (
      <Alert color="signal" title="Cannot open this template">
        {errorText(t.error)}
      </Alert>
    );
  const d = t.data;
  const content = shown === d.currentVersion ? (d.current?.content ?? d.draft) : v.data?.content;
  const print = async () => {
    setPrinting(true);
    try {
      await downloadBlankChecklist(d.id, shown || undefined);
    } catch (e) {
      notifications.show({ color: 'signal', title: 'Not downloaded', message: errorText(e) });
    } finally {
      setPrinting(false);
    }
  };

  return (
    <>
      <Anchor component={Link} to="/checklists" fz="sm" mb="xs" display="inline-flex" style={{ alignItems: 'center', gap: 4 }}>
        <IconArrowLeft size={16} /> All checklists
      </Anchor>
      <PageHeader
        title={d.name}
        subtitle={[
          d.engineName,
          CHECKLIST_PURPOSE_LABELS[d.purpose],
          CHECKLIST_REQUIRED_WHEN_LABELS[d.requiredWhen],
          `signer needs ${DUTY_LABELS[d.requiredDuty].toLowerCase()}`,
        ].join(' · ')}
        state={
          <Group gap="xs">
            {d.currentVersion > 0 ? (
              <Badge size="lg" variant="outline" color="gray">
                Version {d.currentVersion}
              </Badge>
            ) : (
              <Badge size="lg" variant="outline" color="brass">
                {CHECKLIST_TEMPLATE_STATE_WORDS.in_preparation}
              </Badge>
            )}
            {d.hasDraft && (
              <Badge size="lg" variant="outline" color="brass">
                {CHECKLIST_TEMPLATE_WORDS.revision}
              </Badge>
            )}
            {d.withdrawn && (
              <Badge size="lg" variant="outline" color="gray">
                {CHECKLIST_TEMPLATE_STATE_WORDS.withdrawn}
              </Badge>
            )}
          </Group>
        }
        action={
          <Group gap="sm">
            <Button variant="default" size="lg" leftSection={<IconPrinter />} onClick={() => void print()} loading={printing}>
              Blank PDF{shown ? ` (v${shown})` : ''}
            </Button>
            {isChief && !d.withdrawn && (
              <Button component={Link} to={`/checklists/templates/${d.id}/edit`} size="lg" leftSection={<IconPencil />}>
                {d.hasDraft ? 'Continue the revision' : 'Edit'}
              </Button>
            )}
          </Group>
        }
      />
      {d.versions.length > 1 && (
        <Select
          label="Version shown"
          w={260}
          mb="md"
          allowDeselect={false}
          value={String(shown)}
          onChange={(x) => setVersion(Number(x))}
          data={d.versions.map((x) => ({
            value: String(x.version),
            label: `Version ${x.version}${x.version === d.currentVersion ? ' (current)' : ''}`,
          }))}
        />
      )}
      {content ? v.isLoading ? <Loader /> : <TemplateContentView content={content} /> : <Loader />}
      <Title order={2} fz={22} mt="xl" mb="xs">
        Versions
      </Title>
      {d.versions.length === 0 ? (
        <Text c="dimmed">Nothing issued yet.</Text>
      ) : (
        <Table verticalSpacing="xs" aria-label="Versions">
          <Table.Thead>
            <Table.Tr>
              <Table.Th>Version</Table.Th>
              <Table.Th>Issued</Table.Th>
              <Table.Th>By</Table.Th>
              <Table.Th>What changed</Table.Th>
            </Table.Tr>
          </Table.Thead>
          <Table.Tbody>
            {d.versions.map((x) => (
              <Table.Tr key={x.version}>
                <Table.Td className="cj-num">{x.version}</Table.Td>
                <Table.Td>
                  {new Date(x.issuedAt).toLocaleString(undefined, {
                    day: 'numeric',
                    month: 'short',
                    year: 'numeric',
                    hour: '2-digit',
                    minute: '2-digit',
                  })}
                </Table.Td>
                <Table.Td>{x.issuedByName}</Table.Td>
                <Table.Td>{x.changeNote || '—'}</Table.Td>
              </Table.Tr>
            ))}
          </Table.Tbody>
        </Table>
      )}
      {isChief && (
        <Group mt="xl">
          <Button
            variant="subtle"
            color={d.withdrawn ? undefined : 'signal'}
            loading={write.withdraw.isPending}
            onClick={() =>
              write.withdraw.mutate(
                { id: d.id, withdrawn: !d.withdrawn },
                { onError: (e) => notifications.show({ color: 'signal', title: 'Not changed', message: errorText(e) }) },
              )
            }
          >
            {d.withdrawn
              ? `${CHECKLIST_TEMPLATE_WORDS.reissue} this template`
              : `${CHECKLIST_TEMPLATE_WORDS.withdraw} this template (no longer asked for)`}
          </Button>
        </Group>
      )}
    </>
  );
}
