import { useEffect, useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import { Alert, Box, Button, Group, Loader, Stack, Text, Title } from '@mantine/core';
import QRCode from 'qrcode';
import { errorText } from '../../../api/http';
import { visitorBoardsQuery } from '../api/visit.api';
import { publicAddress } from './VisitorBoards.page';

/** A printable page for the engine house: the board's QR code, its address in words, a line of invitation. */
export default function VisitorBoardQrPage() {
  const { id = '' } = useParams();
  const { data, isLoading, error } = useQuery(visitorBoardsQuery());
  const board = data?.find((b) => b.id === id);
  const address = board ? publicAddress(board) : '';
  const [svg, setSvg] = useState<string | null>(null);

  useEffect(() => {
    if (!address) return;
    let live = true;
    // Error correction M (15 %): a printed sheet on a wall may be scuffed or folded.
    QRCode.toString(address, { type: 'svg', errorCorrectionLevel: 'M', margin: 2, color: { dark: '#000000', light: '#ffffff' } })
      .then((s) => live && setSvg(s))
      .catch(() => live && setSvg(null));
    return () => {
      live = false;
    };
  }, [address]);

  if (isLoading) return <Loader />;
  if (error) return <Alert color="red">{errorText(error)}</Alert>;
  if (!board) return <Alert color="red">There is no such visitor board.</Alert>;

  return (
    <Stack maw={640} className="cj-print-sheet">
      <Group className="cj-no-print" gap="sm">
        <Button component={Link} to="/visitor-boards" variant="default">
          Back to visitor boards
        </Button>
        <Button onClick={() => window.print()}>Print</Button>
      </Group>
      {!board.enabled && (
        <Alert color="gray" className="cj-no-print">
          This board is switched off: the code will not open it until it is switched on again.
        </Alert>
      )}
      <Box style={{ background: '#ffffff', color: '#000000', padding: 32, textAlign: 'center' }}>
        <Title order={1} style={{ color: '#000000' }}>
          See the engine at work
        </Title>
        <Text size="xl" mt="sm" style={{ color: '#000000' }}>
          {board.followsLabel}: scan the code with your phone&apos;s camera
        </Text>
        {svg ? (
          <Box
            role="img"
            aria-label={`QR code for ${address}`}
            data-testid="visit-qr"
            mx="auto"
            mt="lg"
            style={{ width: 320, maxWidth: '100%' }}
            // The SVG comes from the qrcode package, built from our own address: no outside markup.
            dangerouslySetInnerHTML={{ __html: svg }}
          />
        ) : (
          <Loader mt="lg" />
        )}
        <Text mt="lg" size="lg" style={{ color: '#000000', wordBreak: 'break-all', fontFamily: 'monospace' }}>
          {address}
        </Text>
      </Box>
    </Stack>
  );
}
