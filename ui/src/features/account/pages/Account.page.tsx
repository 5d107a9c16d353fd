import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { Alert, Button, Card, PasswordInput, SegmentedControl, Stack, Text, TextInput, Title } from '@mantine/core';
import { useForm } from '@mantine/form';
import { notifications } from '@mantine/notifications';
import { MIN_PASSWORD_LENGTH, ROLE_LABELS, type UnitSystem } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { errorText } from '../../../api/http';
import { useSession } from '../../auth/useSession';
import { changePassword, setSigningPin, signOut, updateMe } from '../../auth/api/auth.api';

export default function AccountPage() {
  const session = useSession()!;
  const navigate = useNavigate();
  const [pwError, setPwError] = useState<string | null>(null);
  const [pinError, setPinError] = useState<string | null>(null);
  const pw = useForm({
    initialValues: { currentPassword: '', newPassword: '' },
    validate: { newPassword: (v) => (v.length >= MIN_PASSWORD_LENGTH ? null : `At least ${MIN_PASSWORD_LENGTH} characters`) },
  });
  const pin = useForm({
    initialValues: { currentPassword: '', pin: '' },
    validate: { pin: (v) => (/^\d{4,8}$/.test(v) ? null : '4 to 8 digits') },
  });
  return (
    <Stack maw={640}>
      <PageHeader title="Your account" subtitle={`${session.user.email} · ${ROLE_LABELS[session.user.role]}`} />
      <Card withBorder>
        <Stack>
          <Title order={3}>Units</Title>
          <Text fz="sm" c="dimmed">
            Readings are stored with their own unit; this only changes how they are shown to you.
          </Text>
          <SegmentedControl
            size="md"
            value={session.user.unitSystem}
            data={[
              { value: 'imperial', label: 'Imperial (psi, °F, in)' },
              { value: 'metric', label: 'Metric (bar, °C, mm)' },
            ]}
            onChange={async (v) => {
              try {
                await updateMe({ unitSystem: v as UnitSystem });
              } catch (e) {
                notifications.show({ color: 'signal', message: errorText(e) });
              }
            }}
          />
          <TextInput
            label="Your name as shown on signatures"
            defaultValue={session.user.displayName}
            onBlur={async (e) => {
              const v = e.currentTarget.value.trim();
              if (v && v !== session.user.displayName) await updateMe({ displayName: v });
            }}
          />
        </Stack>
      </Card>
      <Card withBorder>
        <form
          onSubmit={pw.onSubmit(async (v) => {
            setPwError(null);
            try {
              await changePassword(v.currentPassword, v.newPassword);
              pw.reset();
              notifications.show({ message: 'Password changed. Every sign-in has ended, this one too: sign in with the new password.' });
              // The server ended every session of this person (its tokens no longer work): back to the sign-in page.
              await signOut();
              void navigate('/sign-in', { replace: true });
            } catch (e) {
              setPwError(errorText(e));
            }
          })}
        >
          <Stack>
            <Title order={3}>Change password</Title>
            {pwError && <Alert color="signal">{pwError}</Alert>}
            <PasswordInput label="Current password" autoComplete="current-password" {...pw.getInputProps('currentPassword')} />
            <PasswordInput label="New password" autoComplete="new-password" {...pw.getInputProps('newPassword')} />
            <Button type="submit">Change password</Button>
          </Stack>
        </form>
      </Card>
      <Card withBorder>
        <form
          onSubmit={pin.onSubmit(async (v) => {
            setPinError(null);
            try {
              await setSigningPin(v.currentPassword, v.pin);
              pin.reset();
              notifications.show({ message: 'Signing PIN set.' });
            } catch (e) {
              setPinError(errorText(e));
            }
          })}
        >
          <Stack>
            <Title order={3}>Signing PIN</Title>
            <Text fz="sm" c="dimmed">
              When you sign a checklist or countersign a log you are asked to confirm who you are. A short PIN is easier to type in gloves
              than your password.
            </Text>
            {pinError && <Alert color="signal">{pinError}</Alert>}
            <PasswordInput label="Current password" {...pin.getInputProps('currentPassword')} />
            <TextInput label="PIN (4 to 8 digits)" inputMode="numeric" type="password" {...pin.getInputProps('pin')} />
            <Button type="submit">Set signing PIN</Button>
          </Stack>
        </form>
      </Card>
    </Stack>
  );
}
