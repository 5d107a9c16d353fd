import { useEffect, useState } from 'react';
import { Link } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Anchor, Button, Card, FileButton, Group, Loader, Select, Stack, Switch, Text, Textarea, Title } from '@mantine/core';
import { notifications } from '@mantine/notifications';
import type { VisitorBoardDto } from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { errorText } from '../../../api/http';
import { runsListQuery } from '../../runs/api/runs.api';
import { enginesListQuery } from '../../engines/api/engines.api';
import {
  useChangeSlug,
  useCreateVisitorBoard,
  useRemovePhoto,
  useUpdateVisitorBoard,
  useUploadPhoto,
  visitorBoardsQuery,
} from '../api/visit.api';

const STORY_MAX = 4000;

/** The full public address of a board, as printed under its QR code. */
export const publicAddress = (b: Pick<VisitorBoardDto, 'path'>) => `${window.location.origin}${b.path}`;

function BoardCard({ board }: { board: VisitorBoardDto }) {
  const update = useUpdateVisitorBoard();
  const slug = useChangeSlug();
  const upload = useUploadPhoto();
  const removePhoto = useRemovePhoto();
  const [story, setStory] = useState(board.story);
  useEffect(() => setStory(board.story), [board.story]);
  const failed = (e: unknown) => notifications.show({ color: 'red', message: errorText(e) });

  return (
    <Card withBorder padding="lg" data-testid={`board-${board.id}`}>
      <Stack gap="sm">
        <Group justify="space-between" align="flex-start">
          <div>
            <Title order={2} size="h3">
              {board.followsLabel}
            </Title>
            <Text size="sm" c="dimmed">
              {board.scope === 'run' ? 'A board of this run' : 'A board of this engine, whenever it runs'}
            </Text>
          </div>
          <Switch
            size="md"
            label={board.enabled ? 'On: visitors can see it' : 'Off'}
            checked={board.enabled}
            onChange={(e) => update.mutate({ id: board.id, enabled: e.currentTarget.checked }, { onError: failed })}
          />
        </Group>
        <Text size="sm">
          Public address:{' '}
          {board.enabled ? (
            <Anchor href={board.path} target="_blank" rel="noreferrer" style={{ wordBreak: 'break-all' }}>
              {publicAddress(board)}
            </Anchor>
          ) : (
            <span style={{ wordBreak: 'break-all' }}>{publicAddress(board)} (switched off)</span>
          )}
        </Text>
        <Group gap="sm">
          <Button component={Link} to={`/visitor-boards/${board.id}/qr`} variant="default">
            QR code to print
          </Button>
          <Button
            variant="default"
            loading={slug.isPending}
            onClick={() =>
              slug.mutate(board.id, {
                onSuccess: () => notifications.show({ message: 'New address made. The old address and its printed code no longer work.' }),
                onError: failed,
              })
            }
          >
            New address
          </Button>
        </Group>
        <Textarea
          label="The engine's story"
          description={`What visitors read under the figures: plain text, ${STORY_MAX} characters at most. No names of people.`}
          rows={5}
          maxLength={STORY_MAX}
          value={story}
          onChange={(e) => setStory(e.currentTarget.value)}
        />
        <Group gap="sm">
          <Button
            disabled={story === board.story}
            loading={update.isPending}
            onClick={() =>
              update.mutate({ id: board.id, story }, { onSuccess: () => notifications.show({ message: 'Story saved.' }), onError: failed })
            }
          >
            Save the story
          </Button>
          <FileButton
            accept="image/png,image/jpeg,image/webp"
            onChange={(file) => file && upload.mutate({ id: board.id, file }, { onError: failed })}
          >
            {(props) => (
              <Button variant="default" loading={upload.isPending} {...props}>
                {board.hasPhoto ? 'Replace the photo' : 'Add a photo'}
              </Button>
            )}
          </FileButton>
          {board.hasPhoto && (
            <Button variant="subtle" color="gray" onClick={() => removePhoto.mutate(board.id, { onError: failed })}>
              Remove the photo
            </Button>
          )}
        </Group>
        {board.hasPhoto && <Text size="sm">A photo is on the board.</Text>}
      </Stack>
    </Card>
  );
}

/** The chief engineer's screen: visitor boards on and off, their addresses, story and photo. */
export default function VisitorBoardsPage() {
  const { data, isLoading, error } = useQuery(visitorBoardsQuery());
  const runs = useQuery(runsListQuery());
  const engines = useQuery(enginesListQuery());
  const create = useCreateVisitorBoard();
  const [target, setTarget] = useState<string | null>(null);

  if (isLoading) return <Loader />;
  if (error) return <Alert color="red">{errorText(error)}</Alert>;
  const taken = new Set((data ?? []).map((b) => b.runId ?? `engine:${b.engineId}`));
  const choices = [
    ...(runs.data ?? [])
      .filter((r) => r.state !== 'closed' && r.state !== 'abandoned' && !taken.has(r.id))
      .map((r) => ({ value: `run:${r.id}`, label: `Run: ${r.title} (${r.engineName})` })),
    ...(engines.data ?? [])
      .filter((e) => !taken.has(`engine:${e.id}`))
      .map((e) => ({ value: `engine:${e.id}`, label: `Engine: ${e.name}, whenever it runs` })),
  ];

  return (
    <Stack maw={760}>
      <PageHeader title="Visitor boards" />
      <Text c="dimmed">
        A visitor board shows the engine at work to the public, on their phones and on the engine-house wall: speed, turns, steam pressure
        and power, a few seconds late. It never shows names, alarms, checklists, limits, maintenance or money; while an alarm is active it
        only says the engine is resting.
      </Text>
      <Group align="flex-end">
        <Select
          label="Switch a board on for"
          placeholder="Choose a run or an engine"
          data={choices}
          value={target}
          onChange={setTarget}
          size="md"
          style={{ flex: 1 }}
        />
        <Button
          size="md"
          disabled={!target}
          loading={create.isPending}
          onClick={() => {
            if (!target) return;
            const [kind, id] = target.split(':');
            create.mutate(kind === 'run' ? { runId: id } : { engineId: id }, {
              onSuccess: () => setTarget(null),
              onError: (e) => notifications.show({ color: 'red', message: errorText(e) }),
            });
          }}
        >
          Switch on
        </Button>
      </Group>
      {(data ?? []).length === 0 && <Text>No visitor board yet.</Text>}
      {(data ?? []).map((b) => (
        <BoardCard key={b.id} board={b} />
      ))}
    </Stack>
  );
}
