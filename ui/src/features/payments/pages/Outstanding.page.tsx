import { useMemo } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Group, Loader, Stack, Text } from '@mantine/core';
import { PAYMENT_KIND_LABELS, type OutstandingLot } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { errorText } from '../../../api/http';
import { outstandingQuery } from '../api/payments.api';
import { useMoneyLive } from '../api/useMoneyLive';
import { minorMoney } from '../components/LotMoneyPanel';
import { LotReference } from '../../mill/components/LotReference';

const col = columnHelper<OutstandingLot>();

/** Money still due, summed per currency (lots of mills quoting in different currencies are not added together). */
function dueByCurrency(rows: OutstandingLot[]): [string, number][] {
  const sums = new Map<string, number>();
  for (const r of rows) sums.set(r.currency, (sums.get(r.currency) ?? 0) + r.dueMinor);
  return [...sums.entries()].sort(([a], [b]) => a.localeCompare(b));
}

/** /payments/outstanding (administrator): customer lots ordered onwards whose money is not all in, kept current live. */
export default function OutstandingPage() {
  useMoneyLive(true);
  const { data, isLoading, error } = useQuery(outstandingQuery());
  const columns = useMemo(
    () => [
      col.accessor('reference', {
        header: 'Lot',
        cell: (c) => <LotReference lotId={c.row.original.lotId} reference={c.getValue()} customerName={c.row.original.customerName} />,
      }),
      col.accessor('quotedMinor', {
        header: 'Quoted',
        cell: (c) => <Text className="cj-num">{minorMoney(c.getValue(), c.row.original.currency)}</Text>,
      }),
      col.accessor('paidMinor', {
        header: 'Paid (less refunds)',
        cell: (c) => <Text className="cj-num">{minorMoney(c.getValue(), c.row.original.currency)}</Text>,
      }),
      col.accessor('dueMinor', {
        header: 'Due',
        cell: (c) => (
          <Text className="cj-num" fw={600} data-testid={`due-${c.row.original.reference}`}>
            {minorMoney(c.getValue(), c.row.original.currency)}
          </Text>
        ),
      }),
      col.accessor((o) => o.askedKind ?? '', {
        id: 'asked',
        header: 'Asked of the customer',
        cell: (c) => {
          const kind = c.row.original.askedKind;
          return <Text fz="sm">{kind ? `${PAYMENT_KIND_LABELS[kind]} asked, not yet paid` : 'Nothing asked yet'}</Text>;
        },
      }),
    ],
    [],
  );
  if (isLoading) return <Loader />;
  if (error || !data) return <Alert color="signal">{errorText(error)}</Alert>;
  const totals = dueByCurrency(data);
  return (
    <>
      <PageHeader
        title="Money outstanding"
        subtitle="Customer lots ordered onwards whose deposit or balance is not all paid. Open a lot to ask for its money."
      />
      {totals.length > 0 && (
        <Group gap="xl" mb="md" aria-label="Due in all">
          {totals.map(([currency, minor]) => (
            <Stack gap={2} key={currency}>
              <Text fz="xs" fw={700} c="dimmed">
                Due in all, {currency}
              </Text>
              <Text className="cj-num" fz="xl" fw={600} data-testid={`due-total-${currency}`}>
                {minorMoney(minor, currency)}
              </Text>
            </Stack>
          ))}
        </Group>
      )}
      <DataTable
        data={data}
        columns={columns}
        caption="Lots with money outstanding"
        empty="Every lot is paid up."
        getRowId={(o) => o.lotId}
      />
    </>
  );
}
