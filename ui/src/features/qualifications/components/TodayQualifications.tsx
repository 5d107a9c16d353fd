import { Link } from 'react-router-dom';
import { useQueries, useQuery } from '@tanstack/react-query';
import { Button, Card, Group, Stack, Text, Title } from '@mantine/core';
import { DUTY_LABELS, type QualificationDto } from '@crankjournal/shared-types';
import { useHasRole } from '../../auth/useSession';
import { enginesListQuery } from '../../engines/api/engines.api';
import { myQualificationsQuery, qualificationMatrixQuery } from '../api/qualifications.api';
import { QualificationStatusBadge } from './QualificationStatusBadge';

const needsAttention = (q: QualificationDto) => q.status === 'expired' || q.status === 'expiring_soon';

/**
 * The Today panel: qualifications that have ended or end soon — your own, and for the chief engineer the
 * crew's. Shows nothing while all is in order (calm when normal).
 */
export function TodayQualifications() {
  const isChief = useHasRole('chief_engineer');
  const mine = useQuery(myQualificationsQuery());
  const engines = useQuery({ ...enginesListQuery(), enabled: isChief });
  const matrices = useQueries({ queries: (isChief ? (engines.data ?? []) : []).map((e) => qualificationMatrixQuery(e.id)) });
  const own = (mine.data ?? []).filter(needsAttention);
  const crew = isChief ? matrices.flatMap((m) => m.data?.attention ?? []) : [];
  const list = isChief ? crew : own;
  if (!list.length) return null;
  return (
    <Card withBorder padding="lg" radius="md" data-testid="today-qualifications">
      <Stack gap="sm">
        <Title order={2} fz={22}>
          {isChief ? 'Qualifications ending' : 'Your qualifications'}
        </Title>
        {list.map((q) => (
          <Group key={q.id} gap="sm" wrap="nowrap">
            <QualificationStatusBadge status={q.status} size="sm" />
            <Text fz="sm">
              {isChief ? <b>{q.userName}</b> : null}
              {isChief ? ' — ' : ''}
              {DUTY_LABELS[q.duty]} on {q.engineName}:{' '}
              {q.daysToExpiry < 0 ? `ended ${-q.daysToExpiry} day(s) ago` : `ends in ${q.daysToExpiry} day(s)`}
            </Text>
          </Group>
        ))}
        <Button component={Link} to="/qualifications" variant="default" w="fit-content">
          Open qualifications
        </Button>
      </Stack>
    </Card>
  );
}
