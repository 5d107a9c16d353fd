import { Button, Group, Notification, Portal } from '@mantine/core';
import { IconRefresh } from '@tabler/icons-react';
import { useRegisterSW } from 'virtual:pwa-register/react';

/** How often a long-open tablet asks for a new version (the service worker's own check). */
const UPDATE_CHECK_MS = 30 * 60_000;

/**
 * Registers the service worker (production builds) and, when a new version of the app is ready, offers it: the
 * person reloads when it suits them; it is never swapped under them mid-round.
 */
export function UpdatePrompt() {
  const {
    needRefresh: [needRefresh, setNeedRefresh],
    updateServiceWorker,
  } = useRegisterSW({
    onRegisteredSW(_url, registration) {
      if (registration) setInterval(() => void registration.update().catch(() => undefined), UPDATE_CHECK_MS);
    },
  });
  if (!needRefresh) return null;
  return (
    <Portal>
      <Notification
        role="status"
        title="A new version of Crankjournal is ready"
        withCloseButton
        closeButtonProps={{ 'aria-label': 'Later' }}
        onClose={() => setNeedRefresh(false)}
        style={{ position: 'fixed', bottom: 16, left: 16, zIndex: 400, maxWidth: 420 }}
        data-testid="update-prompt"
      >
        Reload when you are between entries; anything waiting to send stays on this tablet.
        <Group mt="xs">
          <Button size="md" leftSection={<IconRefresh size={18} />} onClick={() => void updateServiceWorker(true)}>
            Reload to update
          </Button>
        </Group>
      </Notification>
    </Portal>
  );
}
