import { useMemo } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Loader, Text } from '@mantine/core';
import { MILL_WRITERS, type LotSummary } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { errorText } from '../../../api/http';
import { useHasRole } from '../../auth/useSession';
import { formatPlannedFor } from '../../runs/model/transitions';
import { lotsQuery } from '../api/mill.api';
import { fmt, money, product } from '../model/format';
import { LotStatusBadge } from '../components/LotStatusBadge';
import { LotReference } from '../components/LotReference';
import { NewLotButton } from '../components/LotForm';

const col = columnHelper<LotSummary>();

/** /mill/lots: small customer lots from the slate to dispatch. */
export default function LotsPage() {
  const canWrite = useHasRole(...MILL_WRITERS);
  const { data, isLoading, error } = useQuery(lotsQuery());
  const columns = useMemo(
    () => [
      col.accessor('reference', {
        header: 'Lot',
        cell: (c) => <LotReference lotId={c.row.original.id} reference={c.getValue()} customerName={c.row.original.customerName} />,
      }),
      col.accessor((l) => product(l), { id: 'product', header: 'Product', cell: (c) => <Text fz="sm">{c.getValue()}</Text> }),
      col.accessor('steelGrade', { header: 'Steel' }),
      col.accessor('quantityTonnes', { header: 'Quantity', cell: (c) => <Text className="cj-num">{fmt(c.getValue(), 2)} t</Text> }),
      col.accessor('dueDate', {
        header: 'Due',
        cell: (c) => (
          <Text className="cj-num" fz="sm">
            {formatPlannedFor(c.getValue())}
          </Text>
        ),
      }),
      col.accessor('status', { header: 'Status', cell: (c) => <LotStatusBadge status={c.getValue()} size="md" /> }),
      col.accessor((l) => l.producedTonnes, {
        id: 'made',
        header: 'Produced / scrapped',
        cell: (c) => (
          <Text className="cj-num" fz="sm">
            {fmt(c.row.original.producedTonnes, 2)} t / {fmt(c.row.original.scrappedTonnes, 2)} t
          </Text>
        ),
      }),
      col.accessor((l) => l.latestQuoteTotal ?? -1, {
        id: 'quote',
        header: 'Latest quote',
        cell: (c) => <Text className="cj-num">{money(c.row.original.latestQuoteTotal, c.row.original.currency)}</Text>,
      }),
    ],
    [],
  );
  if (isLoading) return <Loader />;
  if (error || !data) return <Alert color="signal">{errorText(error)}</Alert>;
  return (
    <>
      <PageHeader
        title="Customer lots"
        subtitle="Short paid lots: on the slate → priced → ordered → on the roll plan → rolled → passed → dispatched."
        action={canWrite && <NewLotButton />}
      />
      <DataTable data={data} columns={columns} caption="Customer lots" empty="No lots yet." getRowId={(l) => l.id} />
    </>
  );
}
