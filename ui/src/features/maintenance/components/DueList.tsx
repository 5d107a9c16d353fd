import { Link } from 'react-router-dom';
import { Anchor, Group, Stack, Table, Text } from '@mantine/core';
import { DUE_CRITERION_LABELS, type InspectionPlanDto } from '@crankjournal/shared-types';
import { day, intervalText, remainingText } from '../model/format';
import { DueBadge } from './DueBadge';

/** Plans with their status: the governing criterion, what is left of it and the (estimated) due date. */
export function DueList({
  plans,
  compact = false,
  showEngine = false,
}: {
  plans: InspectionPlanDto[];
  compact?: boolean;
  showEngine?: boolean;
}) {
  return (
    <Table.ScrollContainer minWidth={compact ? 420 : 760}>
      <Table verticalSpacing="sm" aria-label="Due and plans" data-testid="due-list">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Status</Table.Th>
            <Table.Th>Inspection</Table.Th>
            {!compact && <Table.Th>Interval</Table.Th>}
            <Table.Th>Governed by</Table.Th>
            <Table.Th>Due</Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {plans.map((p) => {
            const gov = p.due.criteria.find((c) => c.criterion === p.due.governing);
            return (
              <Table.Tr key={p.id} data-status={p.due.status}>
                <Table.Td w={120}>
                  <DueBadge status={p.due.status} size="sm" />
                </Table.Td>
                <Table.Td>
                  <Stack gap={0}>
                    <Anchor component={Link} to={`/maintenance/plans/${p.id}`} fw={600}>
                      {p.title}
                    </Anchor>
                    <Text fz="xs" c="dimmed">
                      {p.componentLabel}
                      {showEngine ? ` · ${p.engineName}` : ''} · last done {day(p.lastDoneAt)}
                    </Text>
                  </Stack>
                </Table.Td>
                {!compact && <Table.Td fz="sm">{intervalText(p)}</Table.Td>}
                <Table.Td>
                  <Group gap={4} wrap="nowrap">
                    <Text fz="sm">{DUE_CRITERION_LABELS[p.due.governing]}</Text>
                    {gov && (
                      <Text
                        fz="sm"
                        c={gov.remaining <= 0 ? 'var(--cj-signal)' : 'dimmed'}
                        className="cj-num"
                        style={{ whiteSpace: 'nowrap' }}
                      >
                        · {remainingText(gov)}
                      </Text>
                    )}
                  </Group>
                </Table.Td>
                <Table.Td className="cj-num" data-testid="due-date">
                  {p.due.dueDate ? day(p.due.dueDate) : '—'}
                  {p.due.dueDateNote && (
                    <Text fz="xs" c={p.due.status === 'overrun' ? 'var(--cj-signal)' : 'dimmed'}>
                      {p.due.dueDateNote}
                    </Text>
                  )}
                </Table.Td>
              </Table.Tr>
            );
          })}
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
