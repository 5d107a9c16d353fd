import { useEffect, useMemo, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Badge, Button, Code, CopyButton, Group, Loader, Modal, Select, Stack, Text, TextInput } from '@mantine/core';
import { useForm } from '@mantine/form';
import { notifications } from '@mantine/notifications';
import { IconAlertTriangle, IconCheck, IconCopy, IconKey } from '@tabler/icons-react';
import type { IssuedLoggerKey, LoggerDto } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { errorText } from '../../../api/http';
import { enginesListQuery } from '../../engines/api/engines.api';
import { loggersListQuery, useIssueLoggerKey, useRevokeLogger } from '../api/loggers.api';

const col = columnHelper<LoggerDto>();
const when = (iso: string | null) =>
  iso
    ? new Date(iso).toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' })
    : '—';

export default function LoggersPage() {
  const { data, isLoading, error } = useQuery(loggersListQuery());
  const engines = useQuery(enginesListQuery());
  const [issuing, setIssuing] = useState(false);
  const [revoking, setRevoking] = useState<LoggerDto | null>(null);
  const engineName = useMemo(() => new Map((engines.data ?? []).map((e) => [e.id, e.name])), [engines.data]);

  const columns = useMemo(
    () => [
      col.accessor('name', {
        header: 'Logger',
        cell: (c) => (
          <Text fw={600} className={c.row.original.revokedAt ? 'cj-struck' : undefined}>
            {c.getValue()}
          </Text>
        ),
      }),
      col.accessor((l) => engineName.get(l.engineId) ?? '—', { id: 'engine', header: 'Engine' }),
      col.accessor('keyPrefix', { header: 'Key begins', cell: (c) => <Code fz="sm">{c.getValue()}…</Code> }),
      col.accessor('createdAt', {
        header: 'Issued',
        cell: (c) => (
          <Text className="cj-num" fz="sm">
            {when(c.getValue())}
          </Text>
        ),
      }),
      col.accessor('lastSeenAt', {
        header: 'Last sent readings',
        cell: (c) => (
          <Text className="cj-num" fz="sm">
            {when(c.getValue())}
          </Text>
        ),
      }),
      col.display({
        id: 'state',
        header: 'State',
        cell: (c) => {
          const l = c.row.original;
          return l.revokedAt ? (
            <Badge color="gray" variant="outline" size="lg">
              Revoked {when(l.revokedAt)}
            </Badge>
          ) : (
            <Button variant="default" color="signal" size="md" h={48} onClick={() => setRevoking(l)}>
              Revoke key
            </Button>
          );
        },
      }),
    ],
    [engineName],
  );

  return (
    <>
      <PageHeader
        title="Data loggers"
        subtitle={
          'Each logger that sends readings over HTTP has its own key. A key is shown once, when issued; a ' +
          'revoked key is refused from then on.'
        }
        action={
          <Button size="lg" leftSection={<IconKey />} onClick={() => setIssuing(true)}>
            Issue a logger key
          </Button>
        }
      />
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && <DataTable data={data} columns={columns} caption="Data loggers" getRowId={(l) => l.id} empty="No logger keys issued yet." />}
      <IssueModal
        opened={issuing}
        onClose={() => setIssuing(false)}
        engines={(engines.data ?? []).map((e) => ({ value: e.id, label: e.name }))}
      />
      <RevokeModal
        logger={revoking}
        onClose={() => setRevoking(null)}
        engineName={revoking ? engineName.get(revoking.engineId) : undefined}
      />
    </>
  );
}

function IssueModal({ opened, onClose, engines }: { opened: boolean; onClose: () => void; engines: { value: string; label: string }[] }) {
  const issue = useIssueLoggerKey();
  const [issued, setIssued] = useState<IssuedLoggerKey | null>(null);
  const [error, setError] = useState<string | null>(null);
  const form = useForm({
    initialValues: { engineId: '', name: '' },
    validate: {
      engineId: (v) => (v ? null : 'Choose the engine'),
      name: (v) => (v.trim() ? null : 'Name the logger, e.g. “Bearing thermocouples”'),
    },
  });
  const close = () => {
    setIssued(null);
    setError(null);
    form.reset();
    onClose();
  };
  // With one engine on site, choose it.
  const only = engines.length === 1 ? engines[0]!.value : '';
  useEffect(() => {
    if (only && !form.values.engineId) form.setFieldValue('engineId', only);
    // eslint-disable-next-line react-hooks/exhaustive-deps -- form is new each render; choose the engine once per opening
  }, [only, opened]);
  return (
    <Modal
      opened={opened}
      onClose={issued ? () => undefined : close}
      closeOnClickOutside={!issued}
      closeOnEscape={!issued}
      withCloseButton={!issued}
      title={
        <Text fw={700} fz="lg">
          {issued ? 'Store this key now' : 'Issue a logger key'}
        </Text>
      }
      centered
      size="lg"
    >
      {issued ? (
        <Stack>
          <Alert color="amber" variant="outline" icon={<IconAlertTriangle />} title="Shown once">
            This is the only time the key is shown. Copy it into the logger’s settings now. If it is lost, revoke it and issue a new one.
          </Alert>
          <Text>
            Key for <b>{issued.name}</b>:
          </Text>
          <Code block fz="md" data-testid="issued-key" style={{ wordBreak: 'break-all', whiteSpace: 'pre-wrap' }}>
            {issued.key}
          </Code>
          <Text fz="sm" c="dimmed">
            The logger sends it in the <Code>x-logger-key</Code> header with each batch of readings.
          </Text>
          <Group justify="flex-end">
            <CopyButton value={issued.key} timeout={4000}>
              {({ copied, copy }) => (
                <Button
                  size="lg"
                  variant={copied ? 'default' : 'filled'}
                  leftSection={copied ? <IconCheck /> : <IconCopy />}
                  onClick={copy}
                >
                  {copied ? 'Copied' : 'Copy key'}
                </Button>
              )}
            </CopyButton>
            <Button size="lg" variant="default" onClick={close}>
              I have stored the key
            </Button>
          </Group>
        </Stack>
      ) : (
        <form
          onSubmit={form.onSubmit((v) => {
            setError(null);
            issue.mutate(
              { engineId: v.engineId, name: v.name.trim() },
              { onSuccess: (k) => setIssued(k), onError: (e) => setError(errorText(e)) },
            );
          })}
        >
          <Stack>
            {error && (
              <Alert color="signal" role="alert">
                {error}
              </Alert>
            )}
            <Select label="Engine" required allowDeselect={false} data={engines} {...form.getInputProps('engineId')} />
            <TextInput label="Logger name" required placeholder="Main bearing thermocouples" {...form.getInputProps('name')} />
            <Group justify="flex-end">
              <Button variant="default" size="lg" onClick={close}>
                Cancel
              </Button>
              <Button type="submit" size="lg" loading={issue.isPending}>
                Issue key
              </Button>
            </Group>
          </Stack>
        </form>
      )}
    </Modal>
  );
}

function RevokeModal({ logger, onClose, engineName }: { logger: LoggerDto | null; onClose: () => void; engineName?: string }) {
  const revoke = useRevokeLogger();
  const [error, setError] = useState<string | null>(null);
  return (
    <Modal
      opened={!!logger}
      onClose={onClose}
      title={
        <Text fw={700} fz="lg">
          Revoke this logger’s key?
        </Text>
      }
      centered
      size="lg"
    >
      <Stack>
        <Text>
          <b>{logger?.name}</b>
          {engineName ? ` on ${engineName}` : ''} will be refused from now on. Readings it has already sent stay in the log. This cannot be
          undone: to use the logger again, issue it a new key.
        </Text>
        <Text fz="sm" c="dimmed">
          Recorded: the time the key was revoked.
        </Text>
        {error && (
          <Alert color="signal" role="alert">
            {error}
          </Alert>
        )}
        <Group justify="flex-end">
          <Button variant="default" size="lg" onClick={onClose}>
            Keep the key
          </Button>
          <Button
            color="signal"
            size="lg"
            loading={revoke.isPending}
            onClick={() =>
              logger &&
              revoke.mutate(logger.id, {
                onSuccess: (l) => {
                  notifications.show({ message: `${l.name}: key revoked.` });
                  setError(null);
                  onClose();
                },
                onError: (e) => setError(errorText(e)),
              })
            }
          >
            Revoke key
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}
