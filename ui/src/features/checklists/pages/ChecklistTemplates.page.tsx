import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Badge, Button, Group, Loader, Select, Stack, Text } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import { IconPlus, IconPrinter } from '@tabler/icons-react';
import {
  CHECKLIST_TEMPLATE_STATE_WORDS,
  CHECKLIST_TEMPLATE_WORDS,
  CHECKLIST_PURPOSE_LABELS,
  CHECKLIST_REQUIRED_WHEN_LABELS,
  DUTY_LABELS,
  type ChecklistTemplateSummary,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { useHasRole } from '../../auth/useSession';
import { enginesListQuery } from '../../engines/api/engines.api';
import { downloadBlankChecklist, templatesQuery } from '../api/checklists.api';

const col = columnHelper<ChecklistTemplateSummary>();

function PrintButton({ id }: { id: string }) {
  const [busy, setBusy] = useState(false);
  return (
    <Button
      variant="default"
      size="md"
      h={48}
      leftSection={<IconPrinter size={18} />}
      loading={busy}
      onClick={async () => {
        setBusy(true);
        try {
          await downloadBlankChecklist(id);
        } catch (e) {
          notifications.show({ color: 'signal', title: 'Not downloaded', message: errorText(e) });
        } finally {
          setBusy(false);
        }
      }}
    >
      Blank PDF
    </Button>
  );
}

/** Every checklist template of an engine: read and print for all, written by the chief engineer. */
export default function ChecklistTemplatesPage() {
  const isChief = useHasRole('chief_engineer');
  const engines = useQuery(enginesListQuery());
  const [picked, setPicked] = useState<string | null>(null);
  const engineId = picked ?? engines.data?.[0]?.id ?? null;
  const list = useQuery({ ...templatesQuery(engineId ?? undefined), enabled: !!engineId });

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Checklist',
        cell: (c) => (
          <Stack gap={0}>
            <Anchor component={Link} to={`/checklists/templates/${c.row.original.id}`} fw={600} fz="lg">
              {c.getValue()}
            </Anchor>
            <Text fz="sm" c="dimmed">
              {CHECKLIST_PURPOSE_LABELS[c.row.original.purpose]} · {c.row.original.itemCount} items
            </Text>
          </Stack>
        ),
      }),
      col.accessor('requiredWhen', { header: 'When', cell: (c) => CHECKLIST_REQUIRED_WHEN_LABELS[c.getValue()] }),
      col.accessor('requiredDuty', { header: 'Signer needs', cell: (c) => DUTY_LABELS[c.getValue()] }),
      col.accessor('currentVersion', {
        header: 'Version',
        cell: (c) => (
          <Group gap={6}>
            <Text className="cj-num" fz="lg">
              {c.getValue() || '—'}
            </Text>
            {c.row.original.hasDraft && (
              <Badge variant="outline" color="brass">
                {c.row.original.currentVersion > 0 ? CHECKLIST_TEMPLATE_WORDS.revision : CHECKLIST_TEMPLATE_STATE_WORDS.in_preparation}
              </Badge>
            )}
            {c.row.original.withdrawn && (
              <Badge variant="outline" color="gray">
                {CHECKLIST_TEMPLATE_STATE_WORDS.withdrawn}
              </Badge>
            )}
          </Group>
        ),
      }),
      col.display({ id: 'print', header: '', cell: (c) => <PrintButton id={c.row.original.id} /> }),
    ],
    [],
  );

  return (
    <>
      <PageHeader
        title="Checklists"
        subtitle="Templates for the pre-start, warm-up and shutdown checks. Each signed checklist keeps the version it was filled against."
        action={
          isChief &&
          engineId && (
            <Button
              component={Link}
              to={`/checklists/templates/new?engineId=${engineId}`}
              leftSection={<IconPlus />}
              size="lg"
              variant="default"
            >
              New checklist template
            </Button>
          )
        }
      />
      {engines.data && engines.data.length > 1 && (
        <Select
          label="Engine"
          data={engines.data.map((e) => ({ value: e.id, label: e.name }))}
          value={engineId}
          onChange={setPicked}
          w={320}
          mb="md"
          allowDeselect={false}
        />
      )}
      {engines.isLoading || list.isLoading ? (
        <Loader />
      ) : engines.error || list.error ? (
        <Alert color="signal">{errorText(engines.error ?? list.error)}</Alert>
      ) : (
        <DataTable
          data={list.data ?? []}
          columns={columns}
          caption="Checklist templates"
          empty="No checklist templates for this engine yet."
          getRowId={(t) => t.id}
        />
      )}
    </>
  );
}
