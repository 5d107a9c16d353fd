import { Table, Text } from '@mantine/core';
import { CARD_METHOD_LABELS, type CardSetDto } from '@crankjournal/shared-types';
import { endLabel, fmt, pct } from '../model/format';

/** The set's summary table: each end's mean pressure, area and power against its ideal card, and the cylinders' totals and shares. */
export function CardSetSummary({ set }: { set: CardSetDto }) {
  const r = set.results;
  const cardOf = (cardId: string) => set.cards.find((c) => c.id === cardId);
  return (
    <Table.ScrollContainer minWidth={720}>
      <Table verticalSpacing="xs" aria-label="Card set summary" data-testid="card-set-summary" className="cj-num">
        <Table.Thead>
          <Table.Tr>
            <Table.Th>Cylinder end</Table.Th>
            <Table.Th>From</Table.Th>
            <Table.Th ta="right">MEP, psi</Table.Th>
            <Table.Th ta="right">Area, in²</Table.Th>
            <Table.Th ta="right">ihp</Table.Th>
            <Table.Th ta="right">Ideal MEP, psi</Table.Th>
            <Table.Th ta="right">Diagram factor</Table.Th>
            <Table.Th ta="right" title="Steam accounted for by this end’s diagram, per horsepower-hour of this end">
              Steam, lb/ihp·h
            </Table.Th>
          </Table.Tr>
        </Table.Thead>
        <Table.Tbody>
          {r.cylinders.map((c) => [
            ...c.ends.map((e) => (
              <Table.Tr key={`${c.cylinderId}-${e.end}`}>
                <Table.Td>
                  {c.label} {endLabel(e.end).toLowerCase()}
                </Table.Td>
                <Table.Td>
                  <Text fz="sm" c="dimmed">
                    {CARD_METHOD_LABELS[cardOf(e.cardId)?.method ?? 'mep']}
                  </Text>
                </Table.Td>
                <Table.Td ta="right">{fmt(e.meanEffectivePressurePsi, 1)}</Table.Td>
                <Table.Td ta="right">{fmt(e.effectiveAreaSqIn, 1)}</Table.Td>
                <Table.Td ta="right">{fmt(e.indicatedHorsepower, 0)}</Table.Td>
                <Table.Td ta="right" title={e.idealMissing ?? undefined}>
                  {e.ideal ? fmt(e.ideal.meanEffectivePressurePsi, 1) : '—'}
                </Table.Td>
                <Table.Td ta="right">{fmt(e.diagramFactor, 2)}</Table.Td>
                <Table.Td ta="right">{e.steam ? fmt(e.steam.steamPerIhpHourLb, 1) : '—'}</Table.Td>
              </Table.Tr>
            )),
            <Table.Tr key={`${c.cylinderId}-total`} style={{ fontWeight: 600 }}>
              <Table.Td colSpan={4}>
                {c.label} cylinder{c.workShare !== null ? ` — ${pct(c.workShare)} of the work` : ''}
              </Table.Td>
              <Table.Td ta="right">{fmt(c.indicatedHorsepower, 0)}</Table.Td>
              <Table.Td colSpan={3} />
            </Table.Tr>,
          ])}
          <Table.Tr style={{ fontWeight: 700 }}>
            <Table.Td colSpan={4}>Engine</Table.Td>
            <Table.Td ta="right" data-testid="summary-total-ihp">
              {fmt(r.totalIndicatedHorsepower, 0)}
            </Table.Td>
            <Table.Td colSpan={3}>
              <Text fz="sm" c="dimmed" span>
                {fmt(r.totalIndicatedKilowatts, 0)} kW
              </Text>
            </Table.Td>
          </Table.Tr>
        </Table.Tbody>
      </Table>
    </Table.ScrollContainer>
  );
}
