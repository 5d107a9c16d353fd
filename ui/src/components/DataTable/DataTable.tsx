import { Table, Text, UnstyledButton, Group } from '@mantine/core';
import { IconArrowDown, IconArrowUp, IconArrowsSort } from '@tabler/icons-react';
import {
  createColumnHelper,
  createSortedRowModel,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_text,
  tableFeatures,
  useTable,
} from '@tanstack/react-table';

/** The features every Crankjournal table has: sorting by clicking a heading. */
export const tableFeatureSet = tableFeatures({
  rowSortingFeature,
  sortedRowModel: createSortedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text },
});
export type TableFeatureSet = typeof tableFeatureSet;
export const columnHelper = <T extends object>() => createColumnHelper<TableFeatureSet, T>();

interface Props<T extends object> {
  data: T[];
  // eslint-disable-next-line @typescript-eslint/no-explicit-any
  columns: any[];
  empty?: string;
  caption?: string;
  getRowId?: (row: T) => string;
}

/** A sortable table with large rows for touch. */
export function DataTable<T extends object>({ data, columns, empty = 'Nothing here yet.', caption, getRowId }: Props<T>) {
  const table = useTable({ features: tableFeatureSet, columns, data, getRowId: getRowId as never });
  const rows = table.getRowModel().rows;
  return (
    <Table.ScrollContainer minWidth={600}>
      <Table verticalSpacing="sm" highlightOnHover striped={false} aria-label={caption}>
        <Table.Thead>
          {table.getHeaderGroups().map((g) => (
            <Table.Tr key={g.id}>
              {g.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <Table.Th key={h.id}>
                    {h.isPlaceholder ? null : h.column.getCanSort() ? (
                      <UnstyledButton onClick={h.column.getToggleSortingHandler()} style={{ minHeight: 40 }}>
                        <Group gap={4} wrap="nowrap">
                          <table.FlexRender header={h} />
                          {sorted === 'asc' ? (
                            <IconArrowUp size={14} />
                          ) : sorted === 'desc' ? (
                            <IconArrowDown size={14} />
                          ) : (
                            <IconArrowsSort size={14} opacity={0.4} />
                          )}
                        </Group>
                      </UnstyledButton>
                    ) : (
                      <table.FlexRender header={h} />
                    )}
                  </Table.Th>
                );
              })}
            </Table.Tr>
          ))}
        </Table.Thead>
        <Table.Tbody>
          {rows.length === 0 && (
            <Table.Tr>
              <Table.Td colSpan={columns.length}>
                <Text c="dimmed" py="md">
                  {empty}
                </Text>
              </Table.Td>
            </Table.Tr>
          )}
          {rows.map((r) => (
            <Table.Tr key={r.id}>
              {r.getAllCells().map((c) => (
                <Table.Td key={c.id}>
                  <table.FlexRender cell={c} />
                </Table.Td>
              ))}
            </Table.Tr>
          ))}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
