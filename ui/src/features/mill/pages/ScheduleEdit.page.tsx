import { useEffect, useState } from 'react';
import { useNavigate, useParams, useSearchParams } from 'react-router-dom';
import { useQuery } from '@tanstack/react-query';
import {
  ActionIcon,
  Alert,
  Button,
  Card,
  Checkbox,
  Group,
  Loader,
  NumberInput,
  Select,
  SimpleGrid,
  Stack,
  Text,
  TextInput,
  Textarea,
  Title,
} from '@mantine/core';
import { IconArrowsExchange, IconPlus, IconTrash } from '@tabler/icons-react';
import {
  PRODUCT_SHAPES,
  PRODUCT_SHAPE_LABELS,
  type ProductShape,
  type ScheduleDetail,
  type ScheduleWriteRequest,
} from '@crankjournal/shared-types';
import { PageHeader } from '../../../components/PageHeader';
import { errorText } from '../../../api/http';
import { lotsQuery, millsQuery, scheduleQuery, useSaveSchedule } from '../api/mill.api';
import { SectionInput, sectionDraft, sectionOf, type SectionDraft } from '../components/SectionInput';

type Num = number | '';
interface PassForm {
  standPosition: string | null;
  entry: SectionDraft;
  exit: SectionDraft;
  temperature: Num;
  notes: string;
}
interface ScheduleForm {
  millId: string | null;
  name: string;
  isTemplate: boolean;
  productShape: ProductShape;
  productHeightMm: Num;
  productWidthMm: Num;
  steelGrade: string;
  carbonPct: Num;
  stock: SectionDraft;
  stockLengthMm: Num;
  lotId: string | null;
  notes: string;
  archived: boolean;
  passes: PassForm[];
}

const blankPass = (entry?: SectionDraft): PassForm => ({
  standPosition: '1',
  entry: entry ?? sectionDraft(),
  exit: sectionDraft(),
  temperature: '',
  notes: '',
});
const turned = (s: SectionDraft): SectionDraft => (s.shape === 'round' ? { ...s } : { ...s, heightMm: s.widthMm, widthMm: s.heightMm });

function fromSchedule(s: ScheduleDetail): ScheduleForm {
  return {
    millId: s.millId,
    name: s.name,
    isTemplate: s.isTemplate,
    productShape: s.productShape,
    productHeightMm: s.productHeightMm,
    productWidthMm: s.productWidthMm,
    steelGrade: s.steelGrade,
    carbonPct: s.carbonPct,
    stock: sectionDraft(s.stock),
    stockLengthMm: s.stockLengthMm,
    lotId: s.lotId,
    notes: s.notes,
    archived: s.archived,
    passes: s.passes.map((p) => ({
      standPosition: String(p.standPosition),
      entry: sectionDraft(p.entry),
      exit: sectionDraft(p.exit),
      temperature: p.expectedTemperatureC,
      notes: p.notes,
    })),
  };
}

const n = (v: Num) => (v === '' ? (undefined as unknown as number) : Number(v));
const sec = (d: SectionDraft) => sectionOf(d) ?? (undefined as never);

/** The body as typed; the server names what is missing. */
export function toScheduleRequest(f: ScheduleForm): ScheduleWriteRequest {
  return {
    millId: f.millId ?? '',
    name: f.name,
    isTemplate: f.isTemplate,
    productShape: f.productShape,
    productHeightMm: n(f.productHeightMm),
    productWidthMm: f.productShape === 'flat' ? n(f.productWidthMm) : n(f.productHeightMm),
    steelGrade: f.steelGrade,
    carbonPct: n(f.carbonPct),
    stock: sec(f.stock),
    stockLengthMm: n(f.stockLengthMm),
    lotId: f.lotId,
    notes: f.notes,
    archived: f.archived,
    passes: f.passes.map((p) => ({
      standPosition: Number(p.standPosition ?? 0),
      entry: sec(p.entry),
      exit: sec(p.exit),
      expectedTemperatureC: n(p.temperature),
      notes: p.notes,
    })),
  };
}

/** /mill/schedules/new and /mill/schedules/:id/edit: the passes of a product from its stock. */
export default function ScheduleEditPage() {
  const { id } = useParams();
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const mills = useQuery(millsQuery());
  const lots = useQuery(lotsQuery());
  const existing = useQuery({ ...scheduleQuery(id ?? ''), enabled: !!id });
  const save = useSaveSchedule(id);
  const [form, setForm] = useState<ScheduleForm>({
    millId: params.get('mill'),
    name: '',
    isTemplate: false,
    productShape: 'round',
    productHeightMm: '',
    productWidthMm: '',
    steelGrade: 'Mild steel, 0.20 % C',
    carbonPct: 0.2,
    stock: { shape: 'rectangle', heightMm: 76.2, widthMm: 76.2 },
    stockLengthMm: 1800,
    lotId: null,
    notes: '',
    archived: false,
    passes: [blankPass({ shape: 'rectangle', heightMm: 76.2, widthMm: 76.2 })],
  });
  useEffect(() => {
    if (existing.data) setForm(fromSchedule(existing.data));
  }, [existing.data]);
  useEffect(() => {
    if (!form.millId && mills.data?.length) setForm((f) => ({ ...f, millId: mills.data![0].id }));
  }, [mills.data, form.millId]);
  if (id && existing.isLoading) return <Loader />;
  const mill = mills.data?.find((m) => m.id === form.millId);
  const setPass = (i: number, patch: Partial<PassForm>) =>
    setForm((f) => ({ ...f, passes: f.passes.map((p, j) => (j === i ? { ...p, ...patch } : p)) }));
  const submit = () => save.mutate(toScheduleRequest(form), { onSuccess: (s) => void navigate(`/mill/schedules/${s.id}`) });

  return (
    <Stack gap="lg">
      <PageHeader
        title={id ? `Edit ${existing.data?.name ?? 'schedule'}` : 'New pass schedule'}
        subtitle="Sizes in millimetres, as the bar enters and leaves each pass (turn the bar between passes by swapping height and width)."
      />
      <Card withBorder padding="lg">
        <SimpleGrid cols={{ base: 1, sm: 2, lg: 3 }} spacing="md">
          <TextInput label="Name" value={form.name} onChange={(e) => setForm({ ...form, name: e.currentTarget.value })} />
          <Select
            label="Mill"
            data={(mills.data ?? []).map((m) => ({ value: m.id, label: m.name }))}
            value={form.millId}
            onChange={(v) => setForm({ ...form, millId: v })}
          />
          <Select
            label="For a customer lot (optional)"
            clearable
            data={(lots.data ?? []).map((l) => ({ value: l.id, label: `${l.reference} · ${l.customerName}` }))}
            value={form.lotId}
            onChange={(v) => setForm({ ...form, lotId: v })}
          />
          <Select
            label="Product"
            data={PRODUCT_SHAPES.map((p) => ({ value: p, label: PRODUCT_SHAPE_LABELS[p] }))}
            value={form.productShape}
            allowDeselect={false}
            onChange={(v) => v && setForm({ ...form, productShape: v as ProductShape })}
          />
          <NumberInput
            label={form.productShape === 'round' ? 'Diameter, mm' : form.productShape === 'square' ? 'Side, mm' : 'Thickness, mm'}
            hideControls
            inputMode="decimal"
            value={form.productHeightMm}
            onChange={(v) => setForm({ ...form, productHeightMm: v === '' ? '' : Number(v) })}
          />
          {form.productShape === 'flat' && (
            <NumberInput
              label="Width, mm"
              hideControls
              inputMode="decimal"
              value={form.productWidthMm}
              onChange={(v) => setForm({ ...form, productWidthMm: v === '' ? '' : Number(v) })}
            />
          )}
          <TextInput
            label="Steel grade"
            value={form.steelGrade}
            onChange={(e) => setForm({ ...form, steelGrade: e.currentTarget.value })}
          />
          <NumberInput
            label="Carbon, % (for the flow stress)"
            hideControls
            inputMode="decimal"
            value={form.carbonPct}
            onChange={(v) => setForm({ ...form, carbonPct: v === '' ? '' : Number(v) })}
          />
        </SimpleGrid>
        <Group mt="md" align="flex-end" gap="md" wrap="wrap">
          <SectionInput label="Stock" value={form.stock} onChange={(v) => setForm({ ...form, stock: v })} />
          <NumberInput
            label="Stock length, mm"
            w={170}
            hideControls
            inputMode="decimal"
            value={form.stockLengthMm}
            onChange={(v) => setForm({ ...form, stockLengthMm: v === '' ? '' : Number(v) })}
            description=" "
          />
        </Group>
        <Group mt="md">
          <Checkbox
            label="Keep as a template for reuse"
            checked={form.isTemplate}
            onChange={(e) => setForm({ ...form, isTemplate: e.currentTarget.checked })}
          />
          {id && (
            <Checkbox label="Archived" checked={form.archived} onChange={(e) => setForm({ ...form, archived: e.currentTarget.checked })} />
          )}
        </Group>
        <Textarea
          mt="md"
          label="Notes"
          autosize
          minRows={2}
          value={form.notes}
          onChange={(e) => setForm({ ...form, notes: e.currentTarget.value })}
        />
      </Card>
      <Title order={2} fz="xl">
        Passes
      </Title>
      {form.passes.map((p, i) => (
        <Card key={i} withBorder padding="md" role="group" aria-label={`Pass ${i + 1}`}>
          <Group justify="space-between" mb="xs">
            <Text fw={700} fz="lg">
              Pass {i + 1}
            </Text>
            {form.passes.length > 1 && (
              <ActionIcon
                variant="default"
                aria-label={`Remove pass ${i + 1}`}
                onClick={() => setForm((f) => ({ ...f, passes: f.passes.filter((_, j) => j !== i) }))}
              >
                <IconTrash />
              </ActionIcon>
            )}
          </Group>
          <Group align="flex-end" gap="md" wrap="wrap">
            <Select
              label={`Pass ${i + 1}: stand`}
              w={230}
              data={(mill?.stands ?? []).map((s) => ({ value: String(s.position), label: `${s.position}. ${s.name}` }))}
              value={p.standPosition}
              onChange={(v) => setPass(i, { standPosition: v })}
            />
            <NumberInput
              label={`Pass ${i + 1}: expected temperature, °C`}
              w={290}
              hideControls
              inputMode="decimal"
              value={p.temperature}
              onChange={(v) => setPass(i, { temperature: v === '' ? '' : Number(v) })}
            />
          </Group>
          <Group align="flex-end" gap="xs" mt="sm" wrap="wrap">
            <SectionInput label={`Pass ${i + 1} entry`} value={p.entry} onChange={(v) => setPass(i, { entry: v })} />
            <ActionIcon
              variant="default"
              mb={26}
              aria-label={`Turn the bar before pass ${i + 1}`}
              title="Turn a quarter (swap height and width)"
              onClick={() => setPass(i, { entry: turned(p.entry) })}
            >
              <IconArrowsExchange />
            </ActionIcon>
          </Group>
          <SectionInput label={`Pass ${i + 1} exit`} value={p.exit} onChange={(v) => setPass(i, { exit: v })} />
          <TextInput mt="xs" label="Notes" value={p.notes} onChange={(e) => setPass(i, { notes: e.currentTarget.value })} />
        </Card>
      ))}
      <Button
        variant="default"
        leftSection={<IconPlus />}
        w="fit-content"
        onClick={() =>
          setForm((f) => ({
            ...f,
            passes: [
              ...f.passes,
              {
                ...blankPass(turned(f.passes[f.passes.length - 1]?.exit ?? f.stock)),
                standPosition: f.passes[f.passes.length - 1]?.standPosition ?? '1',
              },
            ],
          }))
        }
      >
        Add a pass (entry = last exit, turned)
      </Button>
      {save.error && (
        <Alert color="signal" title="Not saved" role="alert">
          {errorText(save.error)}
        </Alert>
      )}
      <Group>
        <Button size="lg" onClick={submit} loading={save.isPending}>
          Save the schedule
        </Button>
        <Button size="lg" variant="default" onClick={() => navigate(-1)}>
          Cancel
        </Button>
      </Group>
    </Stack>
  );
}
