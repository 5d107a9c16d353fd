import { List, Text } from '@mantine/core';
import type { RecordAmendmentDto } from '@crankjournal/shared-types';
import { changeLabel, changeValue, whenShort } from '../model/format';

/** Amendments of a record: each change with the old value struck through beside the new one, who, when and why. */
export function AmendmentList({ amendments, testId }: { amendments: RecordAmendmentDto[]; testId?: string }) {
  if (!amendments.length) return null;
  return (
    <List spacing={6} size="sm" data-testid={testId} listStyleType="none" ml={0}>
      {amendments.map((a) => (
        <List.Item key={a.id}>
          <Text fz="sm">
            {a.changes.map((c, i) => (
              <span key={c.field}>
                {i > 0 && '; '}
                {changeLabel(c)}{' '}
                <span className="cj-struck" data-testid="amended-from">
                  {changeValue(c.field, c.from)}
                </span>{' '}
                → <strong>{changeValue(c.field, c.to)}</strong>
              </span>
            ))}
          </Text>
          <Text fz="xs" c="dimmed">
            Amended by {a.byName}, {whenShort(a.at)}: “{a.reason}”
          </Text>
        </List.Item>
      ))}
    </List>
  );
}
