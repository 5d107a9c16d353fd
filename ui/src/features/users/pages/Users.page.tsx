import { useMemo, useState } from 'react';
import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { Alert, Badge, Button, Group, Loader, Modal, Select, Stack, Switch, Text, TextInput } from '@mantine/core';
import { useForm } from '@mantine/form';
import { notifications } from '@mantine/notifications';
import { IconMailForward } from '@tabler/icons-react';
import { ROLES, ROLE_LABELS, type Role, type UserSummary } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { DataTable, columnHelper } from '../../../components/DataTable/DataTable';
import { errorText } from '../../../api/http';
import { useSession } from '../../auth/useSession';
import { inviteUser, updateUser, userKeys, usersListQuery } from '../api/users.api';
import { MailQueue } from '../components/MailQueue';

const roleOptions = ROLES.map((r) => ({ value: r, label: ROLE_LABELS[r] }));
const col = columnHelper<UserSummary>();

export default function UsersPage() {
  const qc = useQueryClient();
  const me = useSession()!.user;
  const { data, isLoading, error } = useQuery(usersListQuery());
  const [inviting, setInviting] = useState(false);
  const [confirm, setConfirm] = useState<UserSummary | null>(null);

  const update = useMutation({
    mutationFn: ({ id, ...req }: { id: string; role?: Role; active?: boolean }) => updateUser(id, req),
    onSuccess: (u) => {
      void qc.invalidateQueries({ queryKey: userKeys.all });
      notifications.show({ message: `${u.displayName}: ${ROLE_LABELS[u.role]}, ${u.active ? 'active' : 'deactivated'}` });
    },
    onError: (e) => notifications.show({ color: 'signal', title: 'Not changed', message: errorText(e) }),
  });

  const columns = useMemo(
    () => [
      col.accessor('displayName', { header: 'Name', cell: (c) => <Text fw={600}>{c.getValue()}</Text> }),
      col.accessor('email', { header: 'E-mail' }),
      col.accessor('role', {
        header: 'Role',
        cell: (c) => (
          <Select
            aria-label={`Role of ${c.row.original.displayName}`}
            data={roleOptions}
            value={c.getValue()}
            allowDeselect={false}
            disabled={c.row.original.id === me.id}
            onChange={(v) => v && v !== c.getValue() && update.mutate({ id: c.row.original.id, role: v as Role })}
            w={200}
          />
        ),
      }),
      col.accessor('active', {
        header: 'State',
        cell: (c) => {
          const u = c.row.original;
          return (
            <Group gap="xs" wrap="nowrap">
              {u.invitationPending && (
                <Badge color="brass" variant="light">
                  Invited
                </Badge>
              )}
              <Switch
                size="lg"
                aria-label={`${u.displayName} active`}
                checked={u.active}
                disabled={u.id === me.id}
                label={u.active ? 'Active' : 'Deactivated'}
                onChange={(e) => (e.currentTarget.checked ? update.mutate({ id: u.id, active: true }) : setConfirm(u))}
              />
            </Group>
          );
        },
      }),
    ],
    [me.id, update],
  );

  return (
    <>
      <PageHeader
        title="People and roles"
        subtitle={
          'Who may sign in, and what each person may do. Qualifications for duties on an engine are granted ' +
          'separately by the chief engineer.'
        }
        action={
          <Button leftSection={<IconMailForward />} onClick={() => setInviting(true)}>
            Invite a person
          </Button>
        }
      />
      {isLoading && <Loader />}
      {error && <Alert color="signal">{errorText(error)}</Alert>}
      {data && <DataTable data={data} columns={columns} caption="People" getRowId={(u) => u.id} />}
      <MailQueue />
      <InviteModal opened={inviting} onClose={() => setInviting(false)} />
      <Modal opened={!!confirm} onClose={() => setConfirm(null)} title="Deactivate this person?" centered>
        <Stack>
          <Text>
            {confirm?.displayName} will be signed out at once and cannot sign in again until reactivated. Their entries in the log stay as
            they are.
          </Text>
          <Group justify="flex-end">
            <Button variant="default" onClick={() => setConfirm(null)}>
              Keep active
            </Button>
            <Button
              color="signal"
              onClick={() => {
                if (confirm) update.mutate({ id: confirm.id, active: false });
                setConfirm(null);
              }}
            >
              Deactivate {confirm?.displayName}
            </Button>
          </Group>
        </Stack>
      </Modal>
    </>
  );
}

function InviteModal({ opened, onClose }: { opened: boolean; onClose: () => void }) {
  const qc = useQueryClient();
  const [error, setError] = useState<string | null>(null);
  const form = useForm({
    initialValues: { email: '', displayName: '', role: 'operator' as Role },
    validate: {
      email: (v) => (/^\S+@\S+\.\S+$/.test(v.trim()) ? null : 'Enter an e-mail address'),
      displayName: (v) => (v.trim() ? null : 'Enter the person’s name'),
    },
  });
  const invite = useMutation({
    mutationFn: inviteUser,
    onSuccess: (u) => {
      void qc.invalidateQueries({ queryKey: userKeys.all });
      notifications.show({ title: 'Invitation sent', message: `${u.email} will receive a link to set a password.` });
      form.reset();
      onClose();
    },
    onError: (e) => setError(errorText(e)),
  });
  return (
    <Modal opened={opened} onClose={onClose} title="Invite a person" centered size="lg">
      <form
        onSubmit={form.onSubmit((v) => {
          setError(null);
          invite.mutate({ ...v, email: v.email.trim(), displayName: v.displayName.trim() });
        })}
      >
        <Stack>
          {error && <Alert color="signal">{error}</Alert>}
          <TextInput label="E-mail" type="email" {...form.getInputProps('email')} />
          <TextInput label="Name" {...form.getInputProps('displayName')} />
          <Select label="Role" data={roleOptions} allowDeselect={false} {...form.getInputProps('role')} />
          <Text fz="sm" c="dimmed">
            They receive an e-mail with a one-time link, valid for three days, to set their password.
          </Text>
          <Group justify="flex-end">
            <Button variant="default" onClick={onClose}>
              Cancel
            </Button>
            <Button type="submit" loading={invite.isPending}>
              Send invitation
            </Button>
          </Group>
        </Stack>
      </form>
    </Modal>
  );
}
