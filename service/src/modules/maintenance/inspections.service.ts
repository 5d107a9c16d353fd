import { randomUUID } from 'node:crypto';
import { BadRequestException, HttpException, HttpStatus, Injectable, NotFoundException, PayloadTooLargeException } from '@nestjs/common';
import { InjectDataSource, InjectRepository } from '@nestjs/typeorm';
import { DataSource, Repository, In } from 'typeorm';
import { fileTypeFromBuffer } from 'file-type';
import type { AttachmentDto, InspectionDto, InspectionSummary, MeasurementItemDto, WorkRecordSummary } from '@crankjournal/shared-types';
import { AlarmsService } from '../alarms/alarms.service.js';
import { RunsService } from '../runs/runs.service.js';
import { StorageService } from '../storage/storage.service.js';
import { AppConfig } from '../../config/app-config.service.js';
import { Inspection, InspectionAttachment, InspectionMeasurement } from './inspection.entity.js';
import { WorkRecord } from './work-record.entity.js';
import { EngineFactsService } from './engine-facts.service.js';
import { PlansService } from './plans.service.js';
import { toleranceStatus, webDeflectionSpread } from './tolerance.js';
import type { InspectionCreateDto } from './dto/inspection.dto.js';

/** What an upload may be, judged by its bytes (not its name or declared type). */
export const ATTACHMENT_TYPES: Record<string, { kind: 'image' | 'pdf'; ext: string }> = {
  'image/png': { kind: 'image', ext: 'png' },
  'image/jpeg': { kind: 'image', ext: 'jpg' },
  'image/webp': { kind: 'image', ext: 'webp' },
  'image/gif': { kind: 'image', ext: 'gif' },
  'application/pdf': { kind: 'pdf', ext: 'pdf' },
};

export function workSummary(w: WorkRecord, bearingLabel: string | null): WorkRecordSummary {
  return {
    id: w.id,
    engineId: w.engineId,
    bearingId: w.bearingId,
    bearingLabel,
    title: w.title,
    status: w.status,
    startedAt: w.startedAt.toISOString(),
    closedAt: w.closedAt?.toISOString() ?? null,
    hazards: w.hazards,
    promptedByInspectionId: w.promptedByInspectionId,
    promptedByAlarmId: w.promptedByAlarmId,
  };
}

/** Inspection records: measurements against tolerances, findings, follow-up, photos and documents. */
@Injectable()
export class InspectionsService {
  constructor(
    @InjectDataSource() private readonly db: DataSource,
    @InjectRepository(Inspection) private readonly inspectionRepo: Repository<Inspection>,
    @InjectRepository(InspectionAttachment) private readonly inspectionAttachmentRepo: Repository<InspectionAttachment>,
    @InjectRepository(WorkRecord) private readonly workRecordRepo: Repository<WorkRecord>,
    private readonly facts: EngineFactsService,
    private readonly plans: PlansService,
    private readonly alarms: AlarmsService,
    private readonly runs: RunsService,
    private readonly storage: StorageService,
    private readonly config: AppConfig,
  ) {}

  async get(id: string): Promise<Inspection> {
    const i = await this.inspectionRepo.findOne({ where: { id } });
    if (!i) throw new NotFoundException('No such inspection.');
    return i;
  }

  async list(filter: { engineId?: string; bearingId?: string }): Promise<InspectionSummary[]> {
    const where: Record<string, unknown> = {};
    if (filter.engineId) where.engineId = filter.engineId;
    if (filter.bearingId) where.bearingId = filter.bearingId;
    const rows = await this.inspectionRepo.find({ where, order: { inspectedAt: 'DESC' }, take: 500 });
    return this.summaries(rows);
  }

  async summaries(rows: Inspection[], knownLabels?: Map<string, string>): Promise<InspectionSummary[]> {
    if (!rows.length) return [];
    const ids = rows.map((r) => r.id);
    const counts: { inspection_id: string; n: number; out: number }[] = await this.db.query(
      'SELECT inspection_id, count(*)::int AS n, count(*) FILTER (WHERE out_of_tolerance)::int AS out ' +
        'FROM inspection_measurements WHERE inspection_id = ANY($1) GROUP BY inspection_id',
      [ids],
    );
    const files: { inspection_id: string; n: number }[] = await this.db.query(
      `SELECT inspection_id, count(*)::int AS n FROM inspection_attachments WHERE inspection_id = ANY($1) GROUP BY inspection_id`,
      [ids],
    );
    const bearingLabels = knownLabels ?? (await this.bearingLabels(rows.map((r) => r.engineId)));
    return rows.map((r) => {
      const c = counts.find((x) => x.inspection_id === r.id);
      return {
        id: r.id,
        engineId: r.engineId,
        bearingId: r.bearingId,
        bearingLabel: r.bearingId ? (bearingLabels.get(r.bearingId) ?? null) : null,
        planId: r.planId,
        kind: r.kind,
        title: r.title,
        inspectedAt: r.inspectedAt.toISOString(),
        measurementCount: c?.n ?? 0,
        outOfToleranceCount: c?.out ?? 0,
        attachmentCount: files.find((x) => x.inspection_id === r.id)?.n ?? 0,
        findings: r.findings,
      };
    });
  }

  private async bearingLabels(engineIds: string[]): Promise<Map<string, string>> {
    const out = new Map<string, string>();
    for (const id of new Set(engineIds)) for (const b of (await this.facts.detail(id)).bearings) out.set(b.id, b.label);
    return out;
  }

  async detail(id: string): Promise<InspectionDto> {
    const i = await this.get(id);
    const [summary] = await this.summaries([i]);
    const measurements = await this.db
      .getRepository(InspectionMeasurement)
      .find({ where: { inspectionId: id }, order: { sequence: 'ASC' } });
    const attachments = await this.inspectionAttachmentRepo.find({ where: { inspectionId: id }, order: { uploadedAt: 'ASC' } });
    const work = await this.workRecordRepo.find({ where: { promptedByInspectionId: id }, order: { startedAt: 'ASC' } });
    const names = await this.facts.userNames();
    const engineNames = await this.facts.engineNames();
    const planTitle = i.planId ? ((await this.plans.titles([i.planId])).get(i.planId) ?? null) : null;
    const runTitle = i.promptedByRunId
      ? await this.runs
          .get(i.promptedByRunId)
          .then((r) => r.title)
          .catch(() => null)
      : null;
    const items: MeasurementItemDto[] = measurements.map((m) => {
      const t = toleranceStatus(m.value, m.toleranceMin, m.toleranceMax);
      return {
        id: m.id,
        kind: m.kind,
        label: m.label,
        crankAngleDeg: m.crankAngleDeg,
        value: m.value,
        unit: m.unit,
        nominal: m.nominal,
        toleranceMin: m.toleranceMin,
        toleranceMax: m.toleranceMax,
        note: m.note,
        status: t.status,
        // As decided when it was recorded (the record is not re-judged).
        outOfTolerance: m.outOfTolerance,
        excess: t.excess,
      };
    });
    return {
      ...summary,
      engineName: engineNames.get(i.engineId) ?? '',
      planTitle,
      completesPlan: i.completesPlan,
      inspectorName: i.inspectorName,
      recordedByName: names.get(i.recordedBy) ?? 'unknown',
      runHoursAt: i.runHoursAt,
      revolutionsAt: i.revolutionsAt,
      followUpActions: i.followUpActions,
      measurements: items,
      webDeflection: webDeflectionSpread(measurements),
      attachments: attachments.map((a) => this.attachmentDto(a, names)),
      promptedByAlarmId: i.promptedByAlarmId,
      promptedByRunId: i.promptedByRunId,
      promptedByRunTitle: runTitle,
      workRecords: work.map((w) => workSummary(w, summary.bearingLabel)),
      createdAt: i.createdAt.toISOString(),
    };
  }

  private attachmentDto(a: InspectionAttachment, names: Map<string, string>): AttachmentDto {
    return {
      id: a.id,
      inspectionId: a.inspectionId,
      kind: a.kind,
      filename: a.filename,
      contentType: a.contentType,
      sizeBytes: a.sizeBytes,
      caption: a.caption,
      uploadedByName: names.get(a.uploadedBy) ?? 'unknown',
      uploadedAt: a.uploadedAt.toISOString(),
    };
  }

  async create(dto: InspectionCreateDto, userId: string): Promise<InspectionDto> {
    const engine = await this.facts.detail(dto.engineId);
    const errs: string[] = [];
    if (dto.bearingId && !engine.bearings.some((b) => b.id === dto.bearingId)) errs.push('bearingId is not a bearing of this engine');
    const inspectedAt = new Date(dto.inspectedAt);
    if (inspectedAt.getTime() > Date.now() + 5 * 60_000) errs.push('inspectedAt must not be in the future');
    if (dto.completesPlan && !dto.planId) errs.push('completesPlan needs the planId of the plan it completes');
    (dto.measurements ?? []).forEach((m, i) => {
      if (m.toleranceMin != null && m.toleranceMax != null && m.toleranceMin > m.toleranceMax)
        errs.push(`measurements.${i}.toleranceMin must not be above toleranceMax`);
      if (m.kind === 'web_deflection' && m.crankAngleDeg == null)
        errs.push(`measurements.${i}.crankAngleDeg is needed for a web deflection reading`);
    });
    if (errs.length) throw new BadRequestException({ statusCode: 400, error: 'Bad Request', message: errs });
    const plan = dto.planId ? (await this.plans.ofEngine(dto.engineId, [dto.planId]))[0] : null;
    if (dto.promptedByAlarmId) {
      const a = await this.alarms.get(dto.promptedByAlarmId).catch(() => null);
      if (!a || a.engineId !== dto.engineId) throw new BadRequestException('promptedByAlarmId is not an alarm of this engine.');
    }
    if (dto.promptedByRunId) {
      const r = await this.runs.get(dto.promptedByRunId).catch(() => null);
      if (!r || r.engineId !== dto.engineId) throw new BadRequestException('promptedByRunId is not a run of this engine.');
    }
    const counters = await this.facts.countersAt(dto.engineId, inspectedAt);
    const id = await this.db.transaction(async (m) => {
      const saved = await m.save(
        Inspection,
        m.create(Inspection, {
          engineId: dto.engineId,
          bearingId: dto.bearingId ?? null,
          planId: dto.planId ?? null,
          completesPlan: !!dto.completesPlan,
          kind: dto.kind,
          title: dto.title.trim(),
          inspectedAt,
          inspectorName: dto.inspectorName?.trim() ?? '',
          runHoursAt: counters.runHours,
          revolutionsAt: counters.revolutions,
          findings: dto.findings ?? '',
          followUpActions: (dto.followUpActions ?? []).map((a) => ({ text: a.text.trim(), workRecordId: null })),
          promptedByAlarmId: dto.promptedByAlarmId ?? null,
          promptedByRunId: dto.promptedByRunId ?? null,
          recordedBy: userId,
        }),
      );
      const items = (dto.measurements ?? []).map((x, i) =>
        m.create(InspectionMeasurement, {
          inspectionId: saved.id,
          sequence: i,
          kind: x.kind,
          label: x.label.trim(),
          crankAngleDeg: x.crankAngleDeg ?? null,
          value: x.value,
          unit: x.unit,
          nominal: x.nominal ?? null,
          toleranceMin: x.toleranceMin ?? null,
          toleranceMax: x.toleranceMax ?? null,
          outOfTolerance: toleranceStatus(x.value, x.toleranceMin, x.toleranceMax).outOfTolerance,
          note: x.note ?? '',
        }),
      );
      if (items.length) await m.save(InspectionMeasurement, items);
      if (plan && dto.completesPlan) await this.plans.reset(m, [plan], { completedAt: inspectedAt, counters, inspectionId: saved.id });
      return saved.id;
    });
    return this.detail(id);
  }

  /** Stores a photo or document of an inspection. Images and PDFs only, judged by their bytes; size limited by UPLOAD_MAX_BYTES. */
  async attach(
    inspectionId: string,
    file: { buffer: Buffer; originalname?: string; size: number } | undefined,
    caption: string | undefined,
    userId: string,
  ): Promise<AttachmentDto> {
    await this.get(inspectionId);
    if (!file || !file.buffer?.length) throw new BadRequestException('Send the photo or document as the multipart field "file".');
    const max = this.config.get('UPLOAD_MAX_BYTES');
    if (file.buffer.length > max) throw new PayloadTooLargeException(`The file is larger than ${Math.floor(max / (1024 * 1024))} MB.`);
    const sniffed = await fileTypeFromBuffer(file.buffer);
    const type = sniffed ? ATTACHMENT_TYPES[sniffed.mime] : undefined;
    if (!sniffed || !type)
      throw new HttpException(
        {
          statusCode: 415,
          error: 'Unsupported Media Type',
          message: 'Only photos (PNG, JPEG, WebP, GIF) and PDF documents may be attached; this file is neither.',
        },
        HttpStatus.UNSUPPORTED_MEDIA_TYPE,
      );
    const key = `inspections/${inspectionId}/${randomUUID()}.${type.ext}`;
    await this.storage.put(key, file.buffer, sniffed.mime);
    const base = (file.originalname ?? '')
      .replace(/[\\/]/g, '_')
      .replace(/[^\w.\- ()]+/g, '')
      .trim()
      .slice(0, 150);
    const filename = base ? (base.toLowerCase().endsWith(`.${type.ext}`) ? base : `${base}.${type.ext}`) : `attachment.${type.ext}`;
    const saved = await this.inspectionAttachmentRepo.save({
      inspectionId,
      kind: type.kind,
      contentType: sniffed.mime,
      filename,
      sizeBytes: file.buffer.length,
      storageKey: key,
      caption: caption?.trim() ?? '',
      uploadedBy: userId,
    });
    return this.attachmentDto(saved as InspectionAttachment, await this.facts.userNames());
  }

  async attachmentContent(id: string): Promise<{ attachment: InspectionAttachment; body: Buffer }> {
    const a = await this.inspectionAttachmentRepo.findOne({ where: { id } });
    if (!a) throw new NotFoundException('No such attachment.');
    const { body } = await this.storage.get(a.storageKey);
    return { attachment: a, body };
  }

  /** Inspections of a bearing, oldest first (for its history). */
  async ofBearing(bearingId: string, bearingLabel?: string): Promise<InspectionSummary[]> {
    const rows = await this.inspectionRepo.find({ where: { bearingId }, order: { inspectedAt: 'ASC' } });
    return this.summaries(rows, bearingLabel !== undefined ? new Map([[bearingId, bearingLabel]]) : undefined);
  }

  /** When each of these bearings was last inspected (one grouped query). */
  async lastInspectedAt(bearingIds: string[]): Promise<Map<string, string>> {
    if (!bearingIds.length) return new Map();
    const rows: { bearing_id: string; at: Date }[] = await this.db.query(
      `SELECT bearing_id, max(inspected_at) AS at FROM inspections WHERE bearing_id = ANY($1::uuid[]) GROUP BY bearing_id`,
      [bearingIds],
    );
    return new Map(rows.map((r) => [r.bearing_id, new Date(r.at).toISOString()]));
  }

  async exists(ids: string[]): Promise<Inspection[]> {
    return ids.length ? this.inspectionRepo.find({ where: { id: In(ids) } }) : [];
  }
}
