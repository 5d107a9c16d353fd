import { useEffect, useMemo } from 'react';
import { useQuery } from '@tanstack/react-query';
import { Alert, Button, Group, Loader, NumberInput, Select, Stack, Switch, Text, TextInput } from '@mantine/core';
import { useForm } from '@mantine/form';
import { notifications } from '@mantine/notifications';
import type { SiteSettings } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { errorText } from '../../../api/http';
import { siteSettingsQuery, useUpdateSiteSettings } from '../api/site.api';

/** Every time zone this browser knows, the works' own first if it is not among them. */
function timeZoneChoices(current: string): string[] {
  const known = typeof Intl.supportedValuesOf === 'function' ? Intl.supportedValuesOf('timeZone') : [];
  const all = known.includes('UTC') ? known : ['UTC', ...known];
  return current && !all.includes(current) ? [current, ...all] : all;
}

/** How a time reads in a zone now: the crew checks the choice against the engine-house clock. */
function clockIn(timeZone: string): string {
  try {
    return new Intl.DateTimeFormat(undefined, { timeZone, hour: '2-digit', minute: '2-digit', timeZoneName: 'short' }).format(new Date());
  } catch {
    return '';
  }
}

export default function SiteSettingsPage() {
  const { data, isLoading, error } = useQuery(siteSettingsQuery());
  const save = useUpdateSiteSettings();
  const form = useForm<SiteSettings>({
    initialValues: { worksName: '', timeZone: 'UTC', wetSignature: true, depositSharePct: 30 },
    validate: {
      worksName: (v) => (v.trim().length === 0 ? 'Give the works a name: it heads every printed record.' : null),
      timeZone: (v) => (v ? null : 'Choose the time zone of the engine house.'),
    },
  });
  const { setValues, resetDirty } = form;
  useEffect(() => {
    if (!data) return;
    setValues(data);
    resetDirty(data);
  }, [data, setValues, resetDirty]);
  const zones = useMemo(() => timeZoneChoices(form.values.timeZone), [form.values.timeZone]);

  if (isLoading) return <Loader />;
  if (error) return <Alert color="red">{errorText(error)}</Alert>;

  return (
    <Stack maw={640}>
      <PageHeader title="Works settings" />
      <Text c="dimmed">
        The works&apos; name and time zone head every printed record: the run log sheet, checklists, bearing reports and quotes. Times are
        stored in UTC and printed in this zone, with the zone named.
      </Text>
      <form
        onSubmit={form.onSubmit((values) =>
          save.mutate(
            {
              worksName: values.worksName.trim(),
              timeZone: values.timeZone,
              wetSignature: values.wetSignature,
              depositSharePct: values.depositSharePct,
            },
            {
              onSuccess: () => notifications.show({ message: 'Works settings saved.' }),
            },
          ),
        )}
      >
        <Stack>
          <TextInput label="Name of the works" size="md" {...form.getInputProps('worksName')} />
          <Select
            label="Time zone of the engine house"
            description={form.values.timeZone ? `Now there: ${clockIn(form.values.timeZone)}` : undefined}
            data={zones}
            searchable
            size="md"
            allowDeselect={false}
            {...form.getInputProps('timeZone')}
          />
          <Switch
            label="End the run log sheet with a block for signatures in ink"
            size="md"
            {...form.getInputProps('wetSignature', { type: 'checkbox' })}
          />
          <NumberInput
            label="Deposit asked of a customer, % of the quote"
            description="The mill lead may ask another share or a fixed sum for a lot."
            min={0}
            max={100}
            allowDecimal={false}
            size="md"
            {...form.getInputProps('depositSharePct')}
          />
          {save.error && <Alert color="red">{errorText(save.error)}</Alert>}
          <Group>
            <Button type="submit" size="md" loading={save.isPending} disabled={!form.isDirty()}>
              Save
            </Button>
          </Group>
        </Stack>
      </form>
    </Stack>
  );
}
