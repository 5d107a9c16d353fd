import { useState } from 'react';
import { Alert, Button, Group, Modal, NumberInput, Select, SimpleGrid, Stack, TextInput, Textarea } from '@mantine/core';
import { IconPlus } from '@tabler/icons-react';
import { useNavigate } from 'react-router-dom';
import { PRODUCT_SHAPES, PRODUCT_SHAPE_LABELS, type LotWriteRequest, type ProductShape } from '@crankjournal/shared-types';
import { errorText } from '../../../api/http';
import { useCreateLot } from '../api/mill.api';

type Num = number | '';
const n = (v: Num) => (v === '' ? (undefined as unknown as number) : Number(v));

/** "Put a lot on the slate": a customer's lot as first asked for. */
export function NewLotButton() {
  const [open, setOpen] = useState(false);
  const create = useCreateLot();
  const navigate = useNavigate();
  const [f, setF] = useState({
    customerName: '',
    customerEmail: '',
    customerContact: '',
    productShape: 'round' as ProductShape,
    productHeightMm: '' as Num,
    productWidthMm: '' as Num,
    steelGrade: 'Mild steel, 0.20 % C',
    carbonPct: 0.2 as Num,
    quantityTonnes: '' as Num,
    dueDate: '',
    notes: '',
  });
  const submit = () => {
    const req: LotWriteRequest = {
      customerName: f.customerName,
      customerEmail: f.customerEmail,
      customerContact: f.customerContact,
      productShape: f.productShape,
      productHeightMm: n(f.productHeightMm),
      productWidthMm: f.productShape === 'flat' ? n(f.productWidthMm) : n(f.productHeightMm),
      steelGrade: f.steelGrade,
      carbonPct: f.carbonPct === '' ? null : Number(f.carbonPct),
      quantityTonnes: n(f.quantityTonnes),
      dueDate: f.dueDate,
      notes: f.notes,
    };
    create.mutate(req, { onSuccess: (lot) => void navigate(`/mill/lots/${(lot as { id: string }).id}`) });
  };
  return (
    <>
      <Button size="lg" leftSection={<IconPlus />} onClick={() => setOpen(true)}>
        Put a lot on the slate
      </Button>
      <Modal opened={open} onClose={() => setOpen(false)} title="A lot on the slate" size="xl">
        <Stack>
          <SimpleGrid cols={{ base: 1, sm: 3 }}>
            <TextInput label="Customer" value={f.customerName} onChange={(e) => setF({ ...f, customerName: e.currentTarget.value })} />
            <TextInput label="Contact" value={f.customerContact} onChange={(e) => setF({ ...f, customerContact: e.currentTarget.value })} />
            <TextInput
              label="Customer e-mail"
              type="email"
              value={f.customerEmail}
              onChange={(e) => setF({ ...f, customerEmail: e.currentTarget.value })}
            />
            <Select
              label="Product"
              data={PRODUCT_SHAPES.map((p) => ({ value: p, label: PRODUCT_SHAPE_LABELS[p] }))}
              value={f.productShape}
              allowDeselect={false}
              onChange={(v) => v && setF({ ...f, productShape: v as ProductShape })}
            />
            <NumberInput
              label={f.productShape === 'round' ? 'Diameter, mm' : f.productShape === 'square' ? 'Side, mm' : 'Thickness, mm'}
              hideControls
              inputMode="decimal"
              value={f.productHeightMm}
              onChange={(v) => setF({ ...f, productHeightMm: v === '' ? '' : Number(v) })}
            />
            {f.productShape === 'flat' ? (
              <NumberInput
                label="Width, mm"
                hideControls
                inputMode="decimal"
                value={f.productWidthMm}
                onChange={(v) => setF({ ...f, productWidthMm: v === '' ? '' : Number(v) })}
              />
            ) : (
              <div />
            )}
            <TextInput label="Steel grade" value={f.steelGrade} onChange={(e) => setF({ ...f, steelGrade: e.currentTarget.value })} />
            <NumberInput
              label="Carbon, %"
              hideControls
              inputMode="decimal"
              value={f.carbonPct}
              onChange={(v) => setF({ ...f, carbonPct: v === '' ? '' : Number(v) })}
            />
            <NumberInput
              label="Quantity, tonnes"
              hideControls
              inputMode="decimal"
              value={f.quantityTonnes}
              onChange={(v) => setF({ ...f, quantityTonnes: v === '' ? '' : Number(v) })}
            />
            <TextInput label="Due date" type="date" value={f.dueDate} onChange={(e) => setF({ ...f, dueDate: e.currentTarget.value })} />
          </SimpleGrid>
          <Textarea label="Notes" autosize minRows={2} value={f.notes} onChange={(e) => setF({ ...f, notes: e.currentTarget.value })} />
          {create.error && (
            <Alert color="signal" role="alert">
              {errorText(create.error)}
            </Alert>
          )}
          <Group justify="flex-end">
            <Button variant="default" onClick={() => setOpen(false)}>
              Cancel
            </Button>
            <Button onClick={submit} loading={create.isPending}>
              Put it on the slate
            </Button>
          </Group>
        </Stack>
      </Modal>
    </>
  );
}
