import { Injectable } from '@nestjs/common';
import {
  CHECKLIST_PURPOSE_LABELS,
  CHECKLIST_REQUIRED_WHEN_LABELS,
  DUTY_LABELS,
  HAZARD_LABELS,
  type ChecklistItemDef,
} from '@crankjournal/shared-types';
import { renderRecord, recordFileName, type Block } from '../../common/pdf/record-document.js';
import { zonedClock } from '../../common/pdf/zoned-time.js';
import { EnginesService } from '../engines/engines.service.js';
import { SiteService } from '../site/site.service.js';
import { ChecklistTemplatesService } from './checklist-templates.service.js';
import { rangeText, unitText } from './checklist-rules.js';

export const CHECKLIST_SAFETY_NOTE =
  'Crankjournal aids a qualified crew. It never replaces local boiler and pressure-vessel law, ' +
  'the insurer’s inspections or licensed practice. ' +
  'Lock out the engine before working on it.';

/** A printable blank checklist of a template version, for the day the tablet fails. */
@Injectable()
export class ChecklistPdfService {
  constructor(
    private readonly templates: ChecklistTemplatesService,
    private readonly engines: EnginesService,
    private readonly site: SiteService,
  ) {}

  async blank(
    templateId: string,
    version: number | undefined,
    printedBy: string,
    printedAt = new Date(),
  ): Promise<{ filename: string; buffer: Buffer }> {
    const t = await this.templates.get(templateId);
    const wanted = version ?? t.currentVersion;
    const published = wanted > 0 ? await this.templates.versionRow(templateId, wanted) : null;
    const content = published?.content ?? t.draft!;
    const engine = await this.engines.get(t.engineId);
    const site = await this.site.settings();
    const clock = zonedClock(site.timeZone);
    const versionText = published
      ? `Version ${published.version}, issued ${clock.date(published.publishedAt)}`
      : 'IN PREPARATION: not issued';
    const blocks: Block[] = [
      {
        kind: 'text',
        text:
          `${CHECKLIST_PURPOSE_LABELS[content.purpose]} \u00b7 ${CHECKLIST_REQUIRED_WHEN_LABELS[content.requiredWhen]} \u00b7 ` +
          `the signer must hold a current ${DUTY_LABELS[content.requiredDuty].toLowerCase()} qualification for this engine.`,
        tone: 'muted',
      },
      {
        kind: 'writeIn',
        fields: [
          { label: 'Run', share: 0.45 },
          { label: 'Date', share: 0.25 },
          { label: `Started (${site.timeZone})`, share: 0.3 },
        ],
      },
      ...(content.description ? [{ kind: 'text', text: content.description } as Block] : []),
      {
        kind: 'text',
        size: 8.5,
        tone: 'muted',
        text:
          'Paper copy for when the tablet is not available. Enter every value into Crankjournal afterwards; ' +
          'the start gate only counts checklists signed there.',
      },
    ];
    let n = 0;
    for (const s of content.sections) {
      blocks.push({ kind: 'heading', text: s.title });
      for (const it of s.items) blocks.push(this.item(it, ++n));
    }
    blocks.push(
      { kind: 'heading', text: 'Out-of-range values accepted by the chief engineer' },
      { kind: 'writeIn', fields: [{ label: 'Item, value, reason', share: 1 }] },
      { kind: 'writeIn', fields: [{ label: 'Item, value, reason', share: 1 }] },
      { kind: 'writeIn', fields: [{ label: 'Chief engineer (name and signature)', share: 1 }] },
      { kind: 'heading', text: 'Signature' },
      {
        kind: 'writeIn',
        fields: [
          { label: 'Signed by (name)', share: 0.5 },
          { label: 'Signature', share: 0.5 },
        ],
      },
      {
        kind: 'writeIn',
        fields: [
          { label: 'Date and time', share: 0.5 },
          { label: 'Qualification current (checked by)', share: 0.5 },
        ],
      },
      { kind: 'space', size: 6 },
      { kind: 'text', text: CHECKLIST_SAFETY_NOTE, size: 8, tone: 'muted' },
    );
    const { buffer } = await renderRecord({
      title: `${content.name}: blank checklist`,
      subtitle: `${engine.name} \u00b7 ${versionText}`,
      works: site.worksName,
      engine: engine.name,
      timeZone: site.timeZone,
      printedAt,
      printedBy,
      subject: 'Blank checklist',
      blocks,
    });
    return {
      filename: recordFileName('checklist', null, published ? `${content.name} v${published.version}` : `${content.name} in preparation`),
      buffer,
    };
  }

  private item(it: ChecklistItemDef, n: number): Block {
    const blocks: Block[] = [];
    if (it.help) blocks.push({ kind: 'text', text: it.help, size: 8.5, tone: 'muted' });
    if (it.kind === 'reading') {
      const r = rangeText(it);
      blocks.push({ kind: 'writeIn', fields: [{ label: `Reading, ${unitText(it.unit)}`, share: 0.5 }] });
      if (r) blocks.push({ kind: 'text', text: `Acceptance range: ${r}`, bold: true, size: 9 });
    } else if (it.kind === 'choice') {
      blocks.push({ kind: 'options', options: it.choices ?? [] });
      if (it.acceptable?.length) blocks.push({ kind: 'text', text: `Acceptable: ${it.acceptable.join(', ')}.`, size: 8.5 });
    } else if (it.kind === 'note') {
      blocks.push({ kind: 'writeIn', fields: [{ label: 'Note', share: 1 }] }, { kind: 'writeIn', fields: [{ label: '', share: 1 }] });
    } else if (it.kind === 'photo') {
      blocks.push({ kind: 'options', options: ['Photo taken (add it in Crankjournal afterwards)'] });
    }
    if (it.caution)
      blocks.push({ kind: 'box', label: `CAUTION: ${HAZARD_LABELS[it.caution.hazard]}.`, text: it.caution.text, tone: 'warning' });
    return {
      kind: 'item',
      marker: String(n),
      tickBox: it.kind === 'tick',
      label: `${it.label}${it.required ? '' : ' (optional)'}`,
      blocks,
    };
  }
}
