import { Stack } from '@mantine/core';
import { ROLE_LABELS } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { Caution, SAFETY_NOTE } from '../../../components/Caution/Caution';
import { useSession } from '../../auth/useSession';
import { todayPanels } from '../components/today-panels';

/**
 * The shift board: only what needs this person, in the order they would act (engine now, alarms, the next run's
 * start gate, what is due, qualifications). Feature areas add their panels in today-panels.tsx.
 */
export default function TodayPage() {
  const session = useSession()!;
  const role = session.user.role;
  const panels = todayPanels.filter((p) => p.roles.includes(role));
  return (
    <Stack>
      <PageHeader
        title="Shift board"
        subtitle={`${ROLE_LABELS[role]} · ${new Date().toLocaleDateString(undefined, { weekday: 'long', day: 'numeric', month: 'long' })}`}
      />
      {panels.map((P) => (
        <P.Component key={P.key} />
      ))}
      <Caution title="Safety" hazard="safety">
        {SAFETY_NOTE}
      </Caution>
    </Stack>
  );
}
