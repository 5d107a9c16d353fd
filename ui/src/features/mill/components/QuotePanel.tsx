import { useState } from 'react';
import { Alert, Badge, Button, Card, Group, Modal, NumberInput, Stack, Table, Text, TextInput, Textarea, Title } from '@mantine/core';
import { IconDownload, IconMail } from '@tabler/icons-react';
import { LOT_STATUSES_OPEN_TO_QUOTES, type LotDetail, type QuoteDto } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { downloadQuotePdf, useMakeQuote, useSendQuote } from '../api/mill.api';
import { fmt, money, when } from '../model/format';

type Num = number | '';

function QuoteLines({ q }: { q: QuoteDto }) {
  return (
    <Table verticalSpacing={6} aria-label={`Quote ${q.number}`}>
      <Table.Thead>
        <Table.Tr>
          <Table.Th>Item</Table.Th>
          <Table.Th ta="right">Quantity</Table.Th>
          <Table.Th ta="right">Rate</Table.Th>
          <Table.Th ta="right">Amount</Table.Th>
        </Table.Tr>
      </Table.Thead>
      <Table.Tbody>
        {q.lines.map((l) => (
          <Table.Tr key={l.label}>
            <Table.Td>{l.label}</Table.Td>
            <Table.Td ta="right" className="cj-num">
              {fmt(l.quantity, l.unit === 't' ? 3 : l.unit === 'item' ? 0 : 1)} {l.unit}
            </Table.Td>
            <Table.Td ta="right" className="cj-num">
              {money(l.rate, q.currency)}
            </Table.Td>
            <Table.Td ta="right" className="cj-num">
              {money(l.amount, q.currency)}
            </Table.Td>
          </Table.Tr>
        ))}
        <Table.Tr>
          <Table.Td colSpan={3}>Subtotal</Table.Td>
          <Table.Td ta="right" className="cj-num">
            {money(q.subtotal, q.currency)}
          </Table.Td>
        </Table.Tr>
        <Table.Tr>
          <Table.Td colSpan={3}>Contingency ({fmt(q.contingency.quantity, 1)} %)</Table.Td>
          <Table.Td ta="right" className="cj-num">
            {money(q.contingency.amount, q.currency)}
          </Table.Td>
        </Table.Tr>
        <Table.Tr>
          <Table.Td colSpan={3}>Margin ({fmt(q.margin.quantity, 1)} %)</Table.Td>
          <Table.Td ta="right" className="cj-num">
            {money(q.margin.amount, q.currency)}
          </Table.Td>
        </Table.Tr>
        <Table.Tr>
          <Table.Td colSpan={3} fw={700}>
            Total
          </Table.Td>
          <Table.Td ta="right" className="cj-num" fw={700} data-testid={`quote-total-${q.number}`}>
            {money(q.total, q.currency)}
          </Table.Td>
        </Table.Tr>
      </Table.Tbody>
    </Table>
  );
}

/** Quotes of a lot: make one from the site's rates, download the PDF, e-mail it to the customer. */
export function QuotePanel({ lot, canWrite }: { lot: LotDetail; canWrite: boolean }) {
  const make = useMakeQuote(lot.id);
  const send = useSendQuote();
  const [engineHours, setEngineHours] = useState<Num>('');
  const [crewHours, setCrewHours] = useState<Num>('');
  const [crewSize, setCrewSize] = useState<Num>('');
  const [extraLabel, setExtraLabel] = useState('');
  const [extraAmount, setExtraAmount] = useState<Num>('');
  const [notes, setNotes] = useState('');
  const [sending, setSending] = useState<QuoteDto | null>(null);
  const [to, setTo] = useState(lot.customerEmail);
  const [message, setMessage] = useState('');
  const open = LOT_STATUSES_OPEN_TO_QUOTES.includes(lot.status);
  const latest = lot.quotes[0];
  const submit = () =>
    make.mutate({
      engineHours: engineHours === '' ? (undefined as unknown as number) : Number(engineHours),
      crewHours: crewHours === '' ? (undefined as unknown as number) : Number(crewHours),
      ...(crewSize !== '' ? { crewSize: Number(crewSize) } : {}),
      ...(extraLabel.trim()
        ? { extraFixedCosts: [{ label: extraLabel, amount: extraAmount === '' ? (undefined as unknown as number) : Number(extraAmount) }] }
        : {}),
      notes: notes || undefined,
    });
  return (
    <Card withBorder padding="lg">
      <Title order={2} fz="xl" mb="sm">
        Quotes
      </Title>
      {canWrite && open && (
        <Stack gap="sm" mb="lg">
          <Text fz="sm" c="dimmed">
            From the site’s rates: stock after the yield loss, engine and crew hours, fixed costs, contingency and margin.
          </Text>
          <Group align="flex-end" gap="md" wrap="wrap">
            <NumberInput
              label="Engine hours"
              w={150}
              hideControls
              inputMode="decimal"
              value={engineHours}
              onChange={(v) => setEngineHours(v === '' ? '' : Number(v))}
            />
            <NumberInput
              label="Crew hours (each)"
              w={160}
              hideControls
              inputMode="decimal"
              value={crewHours}
              onChange={(v) => setCrewHours(v === '' ? '' : Number(v))}
            />
            <NumberInput
              label="Crew size"
              w={130}
              hideControls
              inputMode="numeric"
              placeholder="site’s"
              value={crewSize}
              onChange={(v) => setCrewSize(v === '' ? '' : Number(v))}
            />
            <TextInput label="Extra cost (optional)" w={220} value={extraLabel} onChange={(e) => setExtraLabel(e.currentTarget.value)} />
            <NumberInput
              label="Amount"
              w={130}
              hideControls
              inputMode="decimal"
              value={extraAmount}
              onChange={(v) => setExtraAmount(v === '' ? '' : Number(v))}
            />
          </Group>
          <TextInput label="Notes on the quote" value={notes} onChange={(e) => setNotes(e.currentTarget.value)} />
          {make.error && (
            <Alert color="signal" role="alert">
              {errorText(make.error)}
            </Alert>
          )}
          <Button onClick={submit} loading={make.isPending} w="fit-content">
            Make a quote
          </Button>
        </Stack>
      )}
      {!open && lot.quotes.length > 0 && (
        <Text fz="sm" c="dimmed" mb="sm">
          The lot is past quoting: its price is fixed.
        </Text>
      )}
      {lot.quotes.length === 0 && <Text c="dimmed">No quote yet.</Text>}
      <Stack gap="lg">
        {lot.quotes.map((q) => (
          <Stack key={q.id} gap="xs" data-testid={`quote-${q.number}`}>
            <Group justify="space-between" wrap="wrap">
              <Group gap="sm">
                <Text fw={700} fz="lg">
                  Quote {q.number}
                </Text>
                {q.id !== latest?.id && (
                  <Badge color="gray" variant="outline" tt="none">
                    replaced
                  </Badge>
                )}
                {q.sentAt ? (
                  <Badge variant="light" color="copper" tt="none">
                    sent {when(q.sentAt)} to {q.sentTo}
                  </Badge>
                ) : (
                  <Badge variant="outline" color="gray" tt="none">
                    not sent
                  </Badge>
                )}
              </Group>
              <Group gap="sm">
                <Button variant="default" leftSection={<IconDownload size={18} />} onClick={() => downloadQuotePdf(q, lot.reference)}>
                  Quote PDF
                </Button>
                {canWrite && q.id === latest?.id && (
                  <Button
                    leftSection={<IconMail size={18} />}
                    onClick={() => {
                      setTo(lot.customerEmail);
                      setSending(q);
                    }}
                  >
                    E-mail to the customer
                  </Button>
                )}
              </Group>
            </Group>
            <Text fz="sm" c="dimmed">
              {fmt(q.productTonnes, 2)} t of product from {fmt(q.stockTonnes, 3)} t of stock ({fmt(q.yieldLossPct, 1)} % yield loss) ·{' '}
              {fmt(q.engineHours, 1)} engine h · {fmt(q.crewHours, 1)} h × {q.crewSize} crew · made {when(q.createdAt)} by {q.createdByName}
            </Text>
            <QuoteLines q={q} />
            {q.notes && <Text fz="sm">{q.notes}</Text>}
          </Stack>
        ))}
      </Stack>
      <Modal opened={!!sending} onClose={() => setSending(null)} title={`E-mail quote ${sending?.number ?? ''}`}>
        <Stack>
          <Text fz="sm">The quote goes as a PDF attachment. {lot.status === 'on_the_slate' ? 'The lot becomes priced.' : ''}</Text>
          <TextInput label="To" type="email" value={to} onChange={(e) => setTo(e.currentTarget.value)} />
          <Textarea
            label="Message"
            autosize
            minRows={3}
            placeholder={`Please find our quotation for lot ${lot.reference} attached.`}
            value={message}
            onChange={(e) => setMessage(e.currentTarget.value)}
          />
          {send.error && (
            <Alert color="signal" role="alert">
              {errorText(send.error)}
            </Alert>
          )}
          <Group justify="flex-end">
            <Button variant="default" onClick={() => setSending(null)}>
              Cancel
            </Button>
            <Button
              loading={send.isPending}
              onClick={() =>
                sending &&
                send.mutate({ quoteId: sending.id, req: { to, message: message || undefined } }, { onSuccess: () => setSending(null) })
              }
            >
              Send the quote
            </Button>
          </Group>
        </Stack>
      </Modal>
    </Card>
  );
}
