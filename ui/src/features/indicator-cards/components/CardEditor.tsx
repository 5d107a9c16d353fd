import { useEffect, useRef, useState } from 'react';
import { useQuery } from '@tanstack/react-query';
import {
  Alert,
  Button,
  Collapse,
  FileButton,
  Group,
  Loader,
  NumberInput,
  Paper,
  SegmentedControl,
  SimpleGrid,
  Stack,
  Text,
  TextInput,
  Title,
} from '@mantine/core';
import { IconChevronDown, IconChevronUp, IconPhotoUp } from '@tabler/icons-react';
import { TRACE_ORIGIN_LABELS, type AutotraceProposal } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { cardImageQuery, uploadCardImage } from '../api/indicator-cards.api';
import { proposeTraceInBrowser } from '../model/autotrace';
import { fmt } from '../model/format';
import { CardTracer } from './CardTracer';
import { AutotracePanel } from './AutotracePanel';
import { cardMissing, originAfterEdit, parseOrdinates, type AutotraceState, type CardDraft, type CardDraftMethod } from './card-draft';
import { emptyTrace } from './trace-model';

const METHODS: { value: CardDraftMethod; label: string }[] = [
  { value: 'none', label: 'Not taken' },
  { value: 'trace', label: 'Image' },
  { value: 'planimeter', label: 'Planimeter' },
  { value: 'ordinates', label: 'Mid-ordinates' },
  { value: 'mep', label: 'MEP' },
];

/** What the server worked out for this card (from the set preview). */
export interface CardFigures {
  meanEffectivePressurePsi: number;
  meanHeightIn: number | null;
  tracedAreaSqIn: number | null;
  indicatedHorsepower?: number | null;
}

/** The natural size of an image at a URL (null until it has loaded). */
function useImageSize(url: string | null): { widthPx: number; heightPx: number } | null {
  const [size, setSize] = useState<{ widthPx: number; heightPx: number } | null>(null);
  useEffect(() => {
    setSize(null);
    if (!url) return;
    const img = new Image();
    img.onload = () => setSize({ widthPx: img.naturalWidth, heightPx: img.naturalHeight });
    img.src = url;
  }, [url]);
  return size;
}

const ADJUST_WORDS =
  'Drag a point of the outline, an end mark or a mark on the atmospheric line to move it; Undo takes back the last change.';

/** The tracer's answer as the draft keeps it. */
function proposalState(p: AutotraceProposal): AutotraceState {
  if (!p.found || !p.atmosphericLine || !p.admissionEndPx || !p.releaseEndPx) return { status: 'refused', reasons: p.reasons };
  return {
    status: 'proposed',
    proposal: {
      atmosphericLine: [...p.atmosphericLine],
      admissionEndPx: p.admissionEndPx,
      releaseEndPx: p.releaseEndPx,
      pointsPx: p.pointsPx,
    },
    confidence: p.confidence,
    reasons: p.reasons,
  };
}

export interface CardEditorProps {
  runId: string;
  /** e.g. "HP head end". */
  title: string;
  draft: CardDraft;
  onChange: (next: CardDraft) => void;
  figures?: CardFigures | null;
  /** The "Not taken" choice (a set may leave an end out; an amendment may not). */
  allowNone?: boolean;
  testId?: string;
}

/** One card: how its mean height is given (image trace, planimeter, mid-ordinates or MEP) and its figures. */
export function CardEditor({ runId, title, draft, onChange, figures, allowNone = true, testId }: CardEditorProps) {
  const [more, setMore] = useState(
    draft.cutOffPercent !== '' || draft.compressionPercent !== '' || draft.admissionPressurePsig !== '' || !!draft.note,
  );
  const [uploading, setUploading] = useState(false);
  const [uploadError, setUploadError] = useState<string | null>(null);
  // Answers that arrive later (the upload, the proposal) apply to the draft as it is then, not as it was.
  const latest = useRef(draft);
  latest.current = draft;
  const set = (patch: Partial<CardDraft>) => {
    latest.current = { ...latest.current, ...patch };
    onChange(latest.current);
  };
  const photo = useRef(0);
  const numberProps = (
    field:
      | 'springPsiPerIn'
      | 'lengthIn'
      | 'areaSqIn'
      | 'meanEffectivePressurePsi'
      | 'cutOffPercent'
      | 'compressionPercent'
      | 'admissionPressurePsig',
  ) => ({
    value: draft[field],
    onChange: (v: string | number) => set({ [field]: v === '' ? '' : Number(v) } as Partial<CardDraft>),
    inputMode: 'decimal' as const,
    hideControls: true,
    size: 'lg' as const,
  });

  // A stored image (amending a traced card): fetched with the person's token.
  const stored = useQuery({ ...cardImageQuery(draft.imageId ?? ''), enabled: !!draft.imageId && !draft.image });
  const storedSize = useImageSize(!draft.image ? (stored.data ?? null) : null);
  const image = draft.image ?? (stored.data && storedSize ? { url: stored.data, ...storedSize } : null);

  const onFile = async (file: File | null) => {
    if (!file) return;
    const mine = ++photo.current;
    setUploadError(null);
    setUploading(true);
    // The proposal is worked out in the browser while the photo uploads.
    const proposing = proposeTraceInBrowser(file).then(
      (p): AutotraceState => proposalState(p),
      (e: unknown): AutotraceState => ({ status: 'failed', message: e instanceof Error ? e.message : String(e) }),
    );
    try {
      const up = await uploadCardImage(runId, file);
      if (mine !== photo.current) return;
      set({
        imageId: up.id,
        image: { url: URL.createObjectURL(file), widthPx: up.widthPx, heightPx: up.heightPx },
        trace: emptyTrace(),
        traceOrigin: null,
        autotrace: { status: 'finding' },
      });
    } catch (e) {
      setUploadError(errorText(e));
      return;
    } finally {
      setUploading(false);
    }
    const autotrace = await proposing;
    if (mine !== photo.current) return;
    // Someone who began tracing by hand meanwhile keeps their trace; the proposal stays at hand.
    if (latest.current.traceOrigin) set({ autotrace });
    else set({ autotrace, trace: autotrace.status === 'proposed' ? autotrace.proposal : emptyTrace() });
  };

  const missing = cardMissing(draft);
  const ordinates = draft.method === 'ordinates' ? parseOrdinates(draft.ordinatesText) : null;
  const methods = allowNone ? METHODS : METHODS.filter((m) => m.value !== 'none');

  return (
    <Paper withBorder p="md" radius="md" data-testid={testId}>
      <Stack gap="sm">
        <Group justify="space-between" wrap="wrap">
          <Title order={3} fz="lg">
            {title}
          </Title>
          <SegmentedControl
            aria-label={`How the ${title} card is given`}
            data={methods}
            value={draft.method}
            onChange={(v) => set({ method: v as CardDraftMethod })}
            size="md"
          />
        </Group>

        {draft.method !== 'none' && (
          <>
            <SimpleGrid cols={{ base: 2, sm: 3 }} spacing="sm">
              {draft.method !== 'mep' && (
                <NumberInput label="Spring, psi per inch" placeholder="e.g. 80" min={0} {...numberProps('springPsiPerIn')} />
              )}
              {(draft.method === 'planimeter' || draft.method === 'trace') && (
                <NumberInput label="Card length, in" placeholder="e.g. 3.5" min={0} decimalScale={3} {...numberProps('lengthIn')} />
              )}
              {draft.method === 'planimeter' && (
                <NumberInput label="Planimeter area, in²" min={0} decimalScale={3} {...numberProps('areaSqIn')} />
              )}
              {draft.method === 'mep' && (
                <NumberInput label="Mean effective pressure, psi" decimalScale={2} {...numberProps('meanEffectivePressurePsi')} />
              )}
            </SimpleGrid>
            {draft.method === 'ordinates' && (
              <TextInput
                size="lg"
                label="Mid-ordinates, in"
                description="Measured at the middle of equal strips (ten is usual), separated by spaces or commas."
                inputMode="decimal"
                value={draft.ordinatesText}
                onChange={(e) => set({ ordinatesText: e.currentTarget.value })}
                error={ordinates === null ? 'Only numbers, please.' : undefined}
                rightSection={
                  <Text fz="xs" c="dimmed">
                    {ordinates ? ordinates.length : 0}
                  </Text>
                }
              />
            )}
            {draft.method === 'trace' && (
              <Stack gap="xs">
                <Group gap="sm">
                  <FileButton onChange={(f) => void onFile(f)} accept="image/png,image/jpeg,image/webp">
                    {(props) => (
                      <Button
                        {...props}
                        variant={draft.imageId ? 'default' : 'filled'}
                        leftSection={<IconPhotoUp />}
                        loading={uploading}
                        h={52}
                      >
                        {draft.imageId ? 'Use another photo' : 'Upload card photo or scan'}
                      </Button>
                    )}
                  </FileButton>
                  <Text fz="sm" c="dimmed">
                    PNG, JPEG or WebP.
                  </Text>
                </Group>
                {uploadError && (
                  <Alert color="signal" title="Image not taken">
                    {uploadError}
                  </Alert>
                )}
                {draft.imageId && !image && <Loader size="sm" />}
                {image && draft.autotrace && (
                  <AutotracePanel
                    state={draft.autotrace}
                    origin={draft.traceOrigin}
                    onAccept={() => set({ traceOrigin: 'proposed-accepted' })}
                    onByHand={() => set({ trace: emptyTrace(), traceOrigin: 'by-hand' })}
                    onBackToProposal={(proposal) => set({ trace: proposal, traceOrigin: null })}
                  />
                )}
                {image && draft.traceOrigin && draft.traceOrigin !== 'by-hand' && !draft.autotrace && (
                  <Text fz="sm" c="dimmed" data-testid="card-trace-origin">
                    {TRACE_ORIGIN_LABELS[draft.traceOrigin]}
                  </Text>
                )}
                {image && (
                  <CardTracer
                    imageUrl={image.url}
                    widthPx={image.widthPx}
                    heightPx={image.heightPx}
                    value={draft.trace}
                    onChange={(trace) => set({ trace, traceOrigin: originAfterEdit(latest.current) })}
                    appendOnClick={originAfterEdit(draft) === 'by-hand'}
                    instruction={originAfterEdit(draft) === 'adjusted' ? ADJUST_WORDS : undefined}
                  />
                )}
              </Stack>
            )}

            <Button
              variant="subtle"
              size="compact-md"
              onClick={() => setMore((m) => !m)}
              rightSection={more ? <IconChevronUp size={16} /> : <IconChevronDown size={16} />}
              w="fit-content"
            >
              Cut-off, compression and notes for this card
            </Button>
            <Collapse expanded={more}>
              <SimpleGrid cols={{ base: 2, sm: 4 }} spacing="sm">
                <NumberInput label="Cut-off, % (if not the set's)" min={1} max={100} {...numberProps('cutOffPercent')} />
                <NumberInput label="Compression from, % of stroke" min={0} max={90} {...numberProps('compressionPercent')} />
                <NumberInput label="Admission read off the card, psig" {...numberProps('admissionPressurePsig')} />
                <TextInput label="Note" size="lg" value={draft.note} onChange={(e) => set({ note: e.currentTarget.value })} />
              </SimpleGrid>
            </Collapse>

            {missing ? (
              <Text fz="sm" c="dimmed" data-testid="card-missing">
                To work this card out: {missing}.
              </Text>
            ) : figures ? (
              <Group gap="lg" data-testid="card-figures">
                <Text fz="lg" fw={600} className="cj-num" data-testid="card-mep">
                  MEP {fmt(figures.meanEffectivePressurePsi, 1)} psi
                </Text>
                {figures.meanHeightIn !== null && <Text className="cj-num">mean height {fmt(figures.meanHeightIn, 3)} in</Text>}
                {figures.tracedAreaSqIn !== null && <Text className="cj-num">area {fmt(figures.tracedAreaSqIn, 2)} in²</Text>}
                {figures.indicatedHorsepower !== undefined && figures.indicatedHorsepower !== null && (
                  <Text fw={600} className="cj-num" data-testid="card-ihp">
                    {fmt(figures.indicatedHorsepower, 0)} ihp
                  </Text>
                )}
              </Group>
            ) : (
              <Text fz="sm" c="dimmed">
                Working it out…
              </Text>
            )}
          </>
        )}
      </Stack>
    </Paper>
  );
}
