import { Link } from 'react-router-dom';
import { Card, Group, SimpleGrid, Text, ThemeIcon, Title } from '@mantine/core';
import { PageHeader } from '../../../components/PageHeader';
import { useSession } from '../../auth/useSession';
import { CALCULATORS } from '../calculators';

/** Every calculator the person may use, from the registry in calculators.ts. */
export default function CalculatorsPage() {
  const role = useSession()?.user.role;
  const mine = CALCULATORS.filter((c) => role && c.roles.includes(role));
  return (
    <>
      <PageHeader title="Calculators" subtitle="Worked out on the server with the same formulas as the run log; nothing here is stored." />
      <SimpleGrid cols={{ base: 1, sm: 2, lg: 3 }} spacing="md">
        {mine.map((c) => (
          <Card key={c.key} component={Link} to={c.path} withBorder padding="lg" radius="md" data-testid={`calculator-${c.key}`}>
            <Group gap="sm" mb="xs" wrap="nowrap">
              <ThemeIcon variant="light" size={44}>
                <c.icon size={26} />
              </ThemeIcon>
              <Title order={2} fz="lg">
                {c.title}
              </Title>
            </Group>
            <Text fz="sm" c="dimmed">
              {c.description}
            </Text>
          </Card>
        ))}
      </SimpleGrid>
    </>
  );
}
