import { Group, NumberInput, Select, Text } from '@mantine/core';
import { SECTION_SHAPES, SECTION_SHAPE_LABELS, type SectionDto, type SectionShape } from '@crankjournal/shared-types';
import { inchesText } from '../model/format';

export interface SectionDraft {
  shape: SectionShape;
  heightMm: number | '';
  widthMm: number | '';
}
export const sectionDraft = (s?: SectionDto | null): SectionDraft => (s ? { ...s } : { shape: 'rectangle', heightMm: '', widthMm: '' });
/** The section, or null while a size is missing. */
export function sectionOf(d: SectionDraft): SectionDto | null {
  if (d.heightMm === '' || (d.shape !== 'round' && d.widthMm === '')) return null;
  const h = Number(d.heightMm);
  return { shape: d.shape, heightMm: h, widthMm: d.shape === 'round' ? h : Number(d.widthMm) };
}

const num = (v: string | number): number | '' => (v === '' ? '' : Number(v));

/** A bar section: shape, then height and width (a round: its diameter), in mm with inches beside. */
export function SectionInput({
  label,
  value,
  onChange,
  disabled,
}: {
  label: string;
  value: SectionDraft;
  onChange: (v: SectionDraft) => void;
  disabled?: boolean;
}) {
  const round = value.shape === 'round';
  return (
    <Group gap="xs" align="flex-end" wrap="wrap" role="group" aria-label={label}>
      <Select
        label={`${label}: shape`}
        w={215}
        data={SECTION_SHAPES.map((s) => ({ value: s, label: SECTION_SHAPE_LABELS[s] }))}
        value={value.shape}
        allowDeselect={false}
        disabled={disabled}
        onChange={(v) => v && onChange({ ...value, shape: v as SectionShape, widthMm: v === 'round' ? value.heightMm : value.widthMm })}
      />
      <NumberInput
        label={round ? `${label}: diameter, mm` : `${label}: height, mm`}
        w={205}
        hideControls
        inputMode="decimal"
        decimalScale={2}
        disabled={disabled}
        value={value.heightMm}
        onChange={(v) => onChange({ ...value, heightMm: num(v), widthMm: round ? num(v) : value.widthMm })}
        description={value.heightMm !== '' ? inchesText(Number(value.heightMm)) : ' '}
      />
      {!round && (
        <NumberInput
          label={`${label}: width, mm`}
          w={205}
          hideControls
          inputMode="decimal"
          decimalScale={2}
          disabled={disabled}
          value={value.widthMm}
          onChange={(v) => onChange({ ...value, widthMm: num(v) })}
          description={value.widthMm !== '' ? inchesText(Number(value.widthMm)) : ' '}
        />
      )}
      {round && (
        <Text fz="sm" c="dimmed" pb={30}>
          round
        </Text>
      )}
    </Group>
  );
}
