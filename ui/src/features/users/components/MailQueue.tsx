import { useMemo } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Badge, Loader, Stack, Text, Title } from '@mantine/core';
import type { MailJobDto, MailJobState } from '@crankjournal/shared-types';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { errorText } from '../../../api/http';
import { mailJobsQuery } from '../api/users.api';

/** What each state of an e-mail job means to the administrator. */
export const MAIL_STATE_WORDS: Record<MailJobState, string> = {
  created: 'Waiting',
  retry: 'Waiting to try again',
  active: 'Sending',
  completed: 'Sent',
  cancelled: 'Cancelled',
  failed: 'Failed',
};

const col = columnHelper<MailJobDto>();
const time = (iso: string | null) => (iso ? new Date(iso).toLocaleString('en-GB', { dateStyle: 'short', timeStyle: 'medium' }) : '—');

function StateBadge({ job }: { job: MailJobDto }) {
  const words = MAIL_STATE_WORDS[job.state] ?? job.state;
  if (job.state === 'failed') return <Badge color="signal">{words}</Badge>;
  if (job.state === 'retry')
    return (
      <Badge color="amber" variant="outline">
        {words}
      </Badge>
    );
  return (
    <Badge color="gray" variant="outline">
      {words}
    </Badge>
  );
}

/** The outgoing e-mail queue: every e-mail waits here until the mail server has taken it. */
export function MailQueue() {
  const { data, isLoading, error } = useQuery(mailJobsQuery());
  const columns = useMemo(
    () => [
      col.accessor('createdAt', { header: 'Queued', cell: (c) => time(c.getValue()) }),
      col.accessor('to', { header: 'To' }),
      col.accessor('subject', { header: 'Subject' }),
      col.accessor('state', { header: 'State', cell: (c) => <StateBadge job={c.row.original} /> }),
      col.accessor('tries', { header: 'Tries', cell: (c) => `${c.getValue()} of ${c.row.original.retryLimit + 1}` }),
      col.display({
        id: 'when',
        header: 'Next try / sent',
        cell: (c) => time(c.row.original.completedAt ?? c.row.original.nextTryAt),
      }),
      col.accessor('lastError', { header: 'Last failure', cell: (c) => c.getValue() ?? '' }),
    ],
    [],
  );
  return (
    <Stack mt="xl" gap="xs">
      <Title order={2} fz="h3">
        Outgoing e-mail
      </Title>
      <Text c="dimmed" fz="sm">
        Alarm, invitation and quotation e-mails wait here until the mail server takes them, and are tried again while it is away.
      </Text>
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && <DataTable data={data} columns={columns} caption="Outgoing e-mail" getRowId={(j) => j.id} />}
    </Stack>
  );
}
