import { useEffect, useRef, useState } from 'react';
import { useQuery, useQueryClient } from '@tanstack/react-query';
import {
  Alert,
  Anchor,
  Badge,
  Button,
  Card,
  Group,
  Modal,
  NumberInput,
  SegmentedControl,
  SimpleGrid,
  Stack,
  Table,
  Text,
  TextInput,
  Title,
} from '@mantine/core';
import {
  MONEY_ASKERS,
  MONEY_READERS,
  PAYMENT_KIND_LABELS,
  PAYMENT_STATE_LABELS,
  type LotDetail,
  type LotMoney,
  type PaymentDto,
  type PaymentKind,
} from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { money, when } from '../../mill/model/format';
import { lotMoneyQuery, useAskPayment, useRefund } from '../api/payments.api';
import { useMoneyLive } from '../api/useMoneyLive';

/** Minor units (pence, cents) in the currency, through Intl.NumberFormat. */
export function minorMoney(minor: number | null, currency: string): string {
  return minor === null ? '—' : money(minor / 10 ** minorDigits(currency), currency);
}
/** Digits of the currency's minor unit (2 for pounds and dollars, 0 for yen). */
const minorDigits = (currency: string) =>
  new Intl.NumberFormat('en-GB', { style: 'currency', currency }).resolvedOptions().maximumFractionDigits ?? 2;
const toMinor = (amount: number, currency: string) => Math.round(amount * 10 ** minorDigits(currency));

function Figure({ label, value, testId }: { label: string; value: string; testId?: string }) {
  return (
    <Stack gap={2}>
      <Text fz="xs" fw={700} c="dimmed">
        {label}
      </Text>
      <Text className="cj-num" fz="xl" fw={600} data-testid={testId}>
        {value}
      </Text>
    </Stack>
  );
}

function StateBadge({ p }: { p: PaymentDto }) {
  const refunded = p.refundedMinor > 0 ? (p.refundedMinor >= p.amountMinor ? ' · refunded' : ' · part refunded') : '';
  return (
    <Badge variant="outline" color={p.state === 'asked' && p.declineReason ? 'amber' : 'gray'}>
      {PAYMENT_STATE_LABELS[p.state]}
      {refunded}
    </Badge>
  );
}

function AskModal({ lot, money, kind, onClose }: { lot: LotDetail; money: LotMoney; kind: PaymentKind; onClose: () => void }) {
  const ask = useAskPayment(lot.id);
  const [mode, setMode] = useState<'share' | 'sum'>('share');
  const [share, setShare] = useState<number | ''>(money.depositSharePct);
  const [sum, setSum] = useState<number | ''>('');
  const [adjust, setAdjust] = useState<number | ''>('');
  const submit = () => {
    const c = money.currency;
    const req =
      kind === 'deposit'
        ? mode === 'share'
          ? { kind, sharePct: share === '' ? undefined : Number(share) }
          : { kind, amountMinor: sum === '' ? undefined : toMinor(Number(sum), c) }
        : { kind, adjustmentMinor: adjust === '' ? undefined : toMinor(Number(adjust), c) };
    ask.mutate(req, { onSuccess: onClose });
  };
  return (
    <Modal opened onClose={onClose} title={`Lot ${lot.reference}: ask for the ${PAYMENT_KIND_LABELS[kind].toLowerCase()}`}>
      <Stack>
        <Text fz="sm">
          The customer ({lot.customerEmail}) gets an e-mail with a link to the payment service&apos;s own page and the quote as a PDF. No
          card details ever reach Crankjournal.
        </Text>
        {kind === 'deposit' ? (
          <>
            <SegmentedControl
              value={mode}
              onChange={(v) => setMode(v as 'share' | 'sum')}
              data={[
                { value: 'share', label: 'Share of the quote' },
                { value: 'sum', label: 'Fixed sum' },
              ]}
            />
            {mode === 'share' ? (
              <NumberInput
                label="Share of the quote, %"
                min={1}
                max={100}
                allowDecimal={false}
                value={share}
                onChange={(v) => setShare(v === '' ? '' : Number(v))}
              />
            ) : (
              <NumberInput
                label={`Sum, ${money.currency}`}
                min={0}
                decimalScale={2}
                value={sum}
                onChange={(v) => setSum(v === '' ? '' : Number(v))}
              />
            )}
          </>
        ) : (
          <>
            <Text fz="sm">
              Due now: <b className="cj-num">{minorMoney(money.dueMinor, money.currency)}</b> (the quote less what was paid).
            </Text>
            <NumberInput
              label={`Agreed changes, ${money.currency} (plus or minus)`}
              decimalScale={2}
              value={adjust}
              onChange={(v) => setAdjust(v === '' ? '' : Number(v))}
            />
          </>
        )}
        {ask.error && (
          <Alert color="signal" role="alert" title="Not asked">
            {errorText(ask.error)}
          </Alert>
        )}
        <Group justify="flex-end">
          <Button variant="default" onClick={onClose}>
            Cancel
          </Button>
          <Button onClick={submit} loading={ask.isPending}>
            Send the payment link
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}

function RefundModal({ p, onClose }: { p: PaymentDto; onClose: () => void }) {
  const refund = useRefund();
  const left = p.amountMinor - p.refundedMinor;
  const [amount, setAmount] = useState<number | ''>('');
  const [reason, setReason] = useState('');
  return (
    <Modal opened onClose={onClose} title={`Refund the ${PAYMENT_KIND_LABELS[p.kind].toLowerCase()}`}>
      <Stack>
        <Text fz="sm">
          Up to <b className="cj-num">{minorMoney(left, p.currency)}</b> can go back to the customer&apos;s card. Leave the sum empty to
          refund all of it.
        </Text>
        <NumberInput
          label={`Sum, ${p.currency}`}
          min={0}
          decimalScale={2}
          value={amount}
          onChange={(v) => setAmount(v === '' ? '' : Number(v))}
        />
        <TextInput label="Reason" required value={reason} onChange={(e) => setReason(e.currentTarget.value)} />
        {refund.error && (
          <Alert color="signal" role="alert" title="Not refunded">
            {errorText(refund.error)}
          </Alert>
        )}
        <Group justify="flex-end">
          <Button variant="default" onClick={onClose}>
            Cancel
          </Button>
          <Button
            disabled={reason.trim().length < 3}
            loading={refund.isPending}
            onClick={() =>
              refund.mutate(
                {
                  paymentId: p.id,
                  req: { reason: reason.trim(), ...(amount === '' ? {} : { amountMinor: toMinor(Number(amount), p.currency) }) },
                },
                { onSuccess: onClose },
              )
            }
          >
            Refund
          </Button>
        </Group>
      </Stack>
    </Modal>
  );
}

/** A lot's money: quoted, asked, paid, refunded, due, and each payment with its state and time (live, through the money room). */
export function LotMoneyPanel({ lot }: { lot: LotDetail }) {
  const sees = useHasRole(...MONEY_READERS);
  const canAsk = useHasRole(...MONEY_ASKERS);
  const canRefund = useHasRole('administrator');
  const { connected } = useMoneyLive(sees);
  const { data: m, error } = useQuery({ ...lotMoneyQuery(lot.id, { live: connected }), enabled: sees });
  const qc = useQueryClient();
  const [asking, setAsking] = useState<PaymentKind | null>(null);
  const [refunding, setRefunding] = useState<PaymentDto | null>(null);
  // A payment told by the payment service moves the lot on (deposit paid → accepted): read the lot again.
  const paidCount = m?.payments.filter((p) => p.state === 'paid').length ?? 0;
  const seen = useRef(paidCount);
  useEffect(() => {
    if (paidCount !== seen.current) void qc.invalidateQueries({ queryKey: ['mill', 'lots'] });
    seen.current = paidCount;
  }, [paidCount, qc]);
  if (!sees) return null;
  if (error) return <Alert color="signal">{errorText(error)}</Alert>;
  if (!m) return null;
  const open = m.payments.some((p) => p.state === 'asked');
  const mayAskDeposit = canAsk && !open && !m.depositPaid && m.quotedMinor !== null && ['priced', 'ordered'].includes(lot.status);
  const mayAskBalance = canAsk && !open && !m.settled && m.dueMinor > 0 && lot.status === 'dispatched';
  return (
    <Card withBorder padding="lg">
      <Group justify="space-between" mb="sm">
        <Title order={2} fz="xl">
          Money
        </Title>
        <Group gap="xs">
          {m.settled && <Badge variant="outline">Settled</Badge>}
          {mayAskDeposit && <Button onClick={() => setAsking('deposit')}>Ask for the deposit</Button>}
          {mayAskBalance && <Button onClick={() => setAsking('balance')}>Ask for the balance</Button>}
        </Group>
      </Group>
      <SimpleGrid cols={{ base: 2, sm: 5 }} spacing="md" mb="md">
        <Figure label="Quoted" value={minorMoney(m.quotedMinor, m.currency)} />
        <Figure label="Awaiting payment" value={minorMoney(m.askedMinor, m.currency)} />
        <Figure label="Paid" value={minorMoney(m.paidMinor, m.currency)} testId="money-paid" />
        <Figure label="Refunded" value={minorMoney(m.refundedMinor, m.currency)} />
        <Figure label="Due" value={minorMoney(m.dueMinor, m.currency)} />
      </SimpleGrid>
      {m.payments.length === 0 ? (
        <Text c="dimmed">
          Nothing asked yet. The deposit ({m.depositSharePct} % of the quote by default) is asked once the quote is sent.
        </Text>
      ) : (
        <Table.ScrollContainer minWidth={560}>
          <Table aria-label="Payments of the lot">
            <Table.Thead>
              <Table.Tr>
                <Table.Th>Payment</Table.Th>
                <Table.Th ta="right">Sum</Table.Th>
                <Table.Th>State</Table.Th>
                <Table.Th>Asked</Table.Th>
                <Table.Th>Paid</Table.Th>
                <Table.Th />
              </Table.Tr>
            </Table.Thead>
            <Table.Tbody>
              {m.payments.map((p) => (
                <Table.Tr key={p.id} data-testid={`payment-${p.kind}`}>
                  <Table.Td>
                    {PAYMENT_KIND_LABELS[p.kind]}
                    {p.declineReason && (
                      <Text fz="sm" c="dimmed">
                        Last attempt failed: {p.declineReason}
                      </Text>
                    )}
                    {p.refunds.map((r) => (
                      <Text key={r.id} fz="sm" c="dimmed">
                        Refunded {minorMoney(r.amountMinor, p.currency)} on {when(r.at)} by {r.byName}: {r.reason}
                      </Text>
                    ))}
                  </Table.Td>
                  <Table.Td ta="right" className="cj-num">
                    {minorMoney(p.amountMinor, p.currency)}
                  </Table.Td>
                  <Table.Td>
                    <StateBadge p={p} />
                  </Table.Td>
                  <Table.Td>
                    {when(p.askedAt)} by {p.askedByName}
                    {p.checkoutUrl && (
                      <Text fz="sm">
                        <Anchor href={p.checkoutUrl} target="_blank" rel="noreferrer">
                          Payment page
                        </Anchor>{' '}
                        sent to {p.emailedTo}
                      </Text>
                    )}
                  </Table.Td>
                  <Table.Td>{when(p.paidAt)}</Table.Td>
                  <Table.Td>
                    {canRefund && p.state === 'paid' && p.refundedMinor < p.amountMinor && (
                      <Button variant="default" size="xs" onClick={() => setRefunding(p)}>
                        Refund
                      </Button>
                    )}
                  </Table.Td>
                </Table.Tr>
              ))}
            </Table.Tbody>
          </Table>
        </Table.ScrollContainer>
      )}
      {!m.depositPaid && ['priced', 'ordered'].includes(lot.status) && (
        <Text fz="sm" c="dimmed" mt="sm">
          The lot goes on the roll plan once the deposit is paid (or by the chief engineer&apos;s override, with a reason).
        </Text>
      )}
      {asking && <AskModal lot={lot} money={m} kind={asking} onClose={() => setAsking(null)} />}
      {refunding && <RefundModal p={refunding} onClose={() => setRefunding(null)} />}
    </Card>
  );
}
