import { useRef, useState } from 'react';
import Papa from 'papaparse';
import { Alert, Badge, Button, Code, FileInput, Group, Progress, SimpleGrid, Stack, Table, Text } from '@mantine/core';
import { IconAlertOctagon, IconCircleCheck, IconFileTypeCsv, IconUpload, IconX } from '@tabler/icons-react';
import type { ApiError, IngestResult } from '@crankjournal/shared-types';
import { api } from '../../../api/http';
import { sessionStore } from '../../../api/session';

export const REQUIRED_COLUMNS = ['taken_at', 'point', 'value'] as const;
export const OPTIONAL_COLUMNS = ['unit'] as const;
const PREVIEW_BYTES = 64 * 1024;
const PREVIEW_ROWS = 8;

export interface CsvPreview {
  header: string[];
  rows: string[][];
  missing: string[];
  unknown: string[];
  parseErrors: string[];
}

/** Checks the first lines of a logger file in the browser before it is sent. */
export function previewCsv(text: string): CsvPreview {
  const parsed = Papa.parse<string[]>(text, { preview: PREVIEW_ROWS + 1, skipEmptyLines: true });
  const [headerRow = [], ...rows] = parsed.data;
  const header = headerRow.map((h) => h.trim());
  const lower = header.map((h) => h.toLowerCase());
  const missing = REQUIRED_COLUMNS.filter((c) => !lower.includes(c));
  const known: string[] = [...REQUIRED_COLUMNS, ...OPTIONAL_COLUMNS];
  const unknown = header.filter((h) => h !== '' && !known.includes(h.toLowerCase()));
  // The last row of a partial read may be cut short; only report errors on complete rows.
  const parseErrors = parsed.errors.filter((e) => e.code !== 'UndetectableDelimiter').map((e) => `Line ${(e.row ?? 0) + 1}: ${e.message}`);
  return { header, rows, missing, unknown, parseErrors };
}

function isIngestResult(x: unknown): x is IngestResult {
  return !!x && typeof x === 'object' && 'stored' in x && 'rejected' in x;
}

/** True when the access token expires within `marginS` seconds (or cannot be read). */
function tokenExpiresSoon(token: string, marginS = 30): boolean {
  try {
    const payload = JSON.parse(atob(token.split('.')[1].replace(/-/g, '+').replace(/_/g, '/'))) as { exp?: number };
    return !payload.exp || payload.exp * 1000 - Date.now() < marginS * 1000;
  } catch {
    return true;
  }
}

type UploadOutcome =
  { ok: true; result: IngestResult; status: number } | { ok: false; message: string; result: IngestResult | null; status: number };

/** Sends the file as text/csv with XMLHttpRequest, for its upload progress. */
export function uploadCsv(
  runId: string,
  file: Blob,
  onProgress: (fraction: number) => void,
  xhrRef?: { current: XMLHttpRequest | null },
): Promise<UploadOutcome> {
  return new Promise((resolve) => {
    const xhr = new XMLHttpRequest();
    if (xhrRef) xhrRef.current = xhr;
    xhr.open('POST', `/api/runs/${runId}/imports`);
    xhr.setRequestHeader('Content-Type', 'text/csv');
    const token = sessionStore.get()?.accessToken;
    if (token) xhr.setRequestHeader('Authorization', `Bearer ${token}`);
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress(e.loaded / e.total);
    };
    xhr.onload = () => {
      let body: unknown = null;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        /* not JSON */
      }
      if (xhr.status >= 200 && xhr.status < 300 && isIngestResult(body)) return resolve({ ok: true, result: body, status: xhr.status });
      const err = body as ApiError | null;
      const message = err?.message
        ? Array.isArray(err.message)
          ? err.message.join(' ')
          : err.message
        : `The server answered ${xhr.status}.`;
      resolve({ ok: false, message, result: isIngestResult(err?.details) ? err.details : null, status: xhr.status });
    };
    xhr.onerror = () =>
      resolve({ ok: false, message: 'Cannot reach the Crankjournal server. The file was not sent.', result: null, status: 0 });
    xhr.onabort = () => resolve({ ok: false, message: 'Upload cancelled. Nothing was stored.', result: null, status: 0 });
    xhr.send(file);
  });
}

function Report({ result }: { result: IngestResult }) {
  return (
    <Stack gap="sm" data-testid="import-report">
      <SimpleGrid cols={{ base: 2, sm: 4 }}>
        {[
          ['Stored', result.stored],
          ['Already there', result.duplicates],
          ['Refused', result.rejectedCount],
          ['Alarms raised', result.alarmsRaised],
        ].map(([label, n]) => (
          <Stack gap={0} key={label}>
            <Text fz="xs" tt="uppercase" fw={700} c="dimmed">
              {label}
            </Text>
            <Text className="cj-num" fz={30} fw={600}>
              {n}
            </Text>
          </Stack>
        ))}
      </SimpleGrid>
      {result.rejected.length > 0 && (
        <Table.ScrollContainer minWidth={480}>
          <Table aria-label="Refused rows" verticalSpacing="xs">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Line</Table.Th>
                <Table.Th>Column</Table.Th>
                <Table.Th>Reason</Table.Th>
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {[...result.rejected]
                .sort((a, b) => (a.line ?? a.index ?? 0) - (b.line ?? b.index ?? 0))
                .map((r, i) => (
                  <Table.Tr key={i}>
                    <Table.Td className="cj-num">{r.line ?? (r.index !== undefined ? r.index + 1 : '—')}</Table.Td>
                    <Table.Td>{r.column ?? r.field ?? '—'}</Table.Td>
                    <Table.Td>{r.reason}</Table.Td>
                  </Table.Tr>
                ))}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
      {result.rejectedCount > result.rejected.length && (
        <Text fz="sm" c="dimmed">
          The first {result.rejected.length} of {result.rejectedCount} refused rows are listed.
        </Text>
      )}
    </Stack>
  );
}

/** Imports a data logger's CSV file into the run: check in the browser, upload with progress, then the server's report. */
export function CsvImport({ runId, onImported }: { runId: string; onImported?: (r: IngestResult) => void }) {
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<CsvPreview | null>(null);
  const [readError, setReadError] = useState<string | null>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [outcome, setOutcome] = useState<UploadOutcome | null>(null);
  const xhr = useRef<XMLHttpRequest | null>(null);
  const uploading = progress !== null && outcome === null;

  const pick = async (f: File | null) => {
    setFile(f);
    setPreview(null);
    setOutcome(null);
    setProgress(null);
    setReadError(null);
    if (!f) return;
    try {
      setPreview(previewCsv(await f.slice(0, PREVIEW_BYTES).text()));
    } catch {
      setReadError('This file cannot be read.');
    }
  };

  const send = async () => {
    if (!file) return;
    setOutcome(null);
    setProgress(0);
    const token = sessionStore.get()?.accessToken;
    // The API client refreshes an expiring sign-in; XMLHttpRequest does not, so ask it to first.
    if (token && tokenExpiresSoon(token)) await api(`/runs/${runId}`).catch(() => undefined);
    const o = await uploadCsv(runId, file, setProgress, xhr);
    xhr.current = null;
    setProgress(1);
    setOutcome(o);
    if (o.result && o.result.stored > 0) onImported?.(o.result);
  };

  const blocked = !preview || preview.missing.length > 0;
  return (
    <Stack gap="md">
      <Text fz="sm">
        A logger file with a header line and the columns <Code>taken_at</Code>, <Code>point</Code>, <Code>value</Code> and optionally{' '}
        <Code>unit</Code>. <Code>taken_at</Code> is an ISO time (e.g. <Code>2025-06-14T10:15:00Z</Code>), <Code>point</Code> the measurement
        point’s code (e.g. <Code>MB1-T</Code>), <Code>unit</Code> when given must be the point’s unit. Rows already stored are counted, not
        stored twice.
      </Text>
      <FileInput
        label="Logger file (CSV)"
        placeholder="Choose a .csv file"
        accept=".csv,text/csv"
        size="lg"
        leftSection={<IconFileTypeCsv />}
        value={file}
        onChange={(f) => void pick(f)}
        clearable
        disabled={uploading}
      />
      {readError && <Alert color="signal">{readError}</Alert>}
      {preview && file && (
        <Stack gap="xs" data-testid="csv-preview">
          <Group gap="xs">
            <Text fw={600}>Header:</Text>
            {preview.header.map((h, i) => (
              <Badge key={i} variant="outline" color={preview.unknown.includes(h) ? 'amber' : 'gray'} tt="none">
                {h || '(empty)'}
              </Badge>
            ))}
            <Text fz="sm" c="dimmed">
              · {(file.size / 1024).toFixed(file.size < 10_240 ? 1 : 0)} kB
            </Text>
          </Group>
          {preview.missing.length > 0 && (
            <Alert color="signal" variant="light" icon={<IconAlertOctagon />} title="This file cannot be imported">
              Missing column{preview.missing.length > 1 ? 's' : ''}: {preview.missing.join(', ')}. The first line must name the columns
              taken_at, point, value (and optionally unit).
            </Alert>
          )}
          {preview.unknown.length > 0 && (
            <Text fz="sm" c="var(--cj-amber)">
              Columns the import does not use: {preview.unknown.join(', ')}.
            </Text>
          )}
          {preview.parseErrors.length > 0 && (
            <Text fz="sm" c="var(--cj-amber)">
              {preview.parseErrors.slice(0, 3).join(' · ')}
            </Text>
          )}
          <Table.ScrollContainer minWidth={400}>
            <Table withTableBorder fz="sm" verticalSpacing={4} aria-label="First lines of the file">
              <Table.Thead>
                <Table.Tr>
                  <Table.Th>Line</Table.Th>
                  {preview.header.map((h, i) => (
                    <Table.Th key={i}>{h}</Table.Th>
                  ))}
                </Table.Tr>
              </Table.Thead>
              <Table.Tbody>
                {preview.rows.map((r, i) => (
                  <Table.Tr key={i}>
                    <Table.Td c="dimmed">{i + 2}</Table.Td>
                    {preview.header.map((_, j) => (
                      <Table.Td key={j} className="cj-num">
                        {r[j] ?? ''}
                      </Table.Td>
                    ))}
                  </Table.Tr>
                ))}
              </Table.Tbody>
            </Table>
          </Table.ScrollContainer>
          <Text fz="xs" c="dimmed">
            The first {preview.rows.length} line(s) after the header; the server checks every line.
          </Text>
        </Stack>
      )}
      {progress !== null && (
        <Stack gap={4}>
          <Progress value={Math.round(progress * 100)} size="xl" aria-label="Upload progress" animated={uploading} />
          <Text fz="sm" c="dimmed">
            {uploading ? (progress < 1 ? `Sending… ${Math.round(progress * 100)} %` : 'Sent; the server is checking the rows…') : 'Done.'}
          </Text>
        </Stack>
      )}
      <Group>
        <Button
          size="lg"
          leftSection={<IconUpload />}
          disabled={blocked || uploading || !file}
          loading={uploading}
          onClick={() => void send()}
        >
          Import readings
        </Button>
        {uploading && (
          <Button size="lg" variant="default" leftSection={<IconX />} onClick={() => xhr.current?.abort()}>
            Cancel
          </Button>
        )}
      </Group>
      {outcome && (
        <Alert
          color={outcome.ok && outcome.result.rejectedCount === 0 ? 'gray' : outcome.ok || outcome.result ? 'amber' : 'signal'}
          variant="outline"
          icon={outcome.ok ? <IconCircleCheck color="var(--mantine-color-copper-5)" /> : <IconAlertOctagon />}
          title={
            outcome.ok
              ? outcome.result.rejectedCount === 0
                ? 'Imported'
                : 'Imported, with some rows refused'
              : outcome.result
                ? 'Some rows refused; the good rows were stored'
                : 'Not imported'
          }
          role={outcome.ok ? 'status' : 'alert'}
        >
          <Stack gap="sm">
            {!outcome.ok && <Text fz="sm">{outcome.message}</Text>}
            {outcome.result && <Report result={outcome.result} />}
          </Stack>
        </Alert>
      )}
    </Stack>
  );
}
