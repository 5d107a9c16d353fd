import { createHash, randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import { Repository } from 'typeorm';
import { InjectRepository } from '@nestjs/typeorm';
import { BadRequestException, HttpException, Injectable, NotFoundException, UnsupportedMediaTypeException } from '@nestjs/common';
import type { CardImageDto } from '@crankjournal/shared-types';
import { StorageService } from '../storage/storage.service.js';
import { RunsService } from '../runs/runs.service.js';
import { AppConfig } from '../../config/app-config.service.js';
import type { AuthUser } from '../../common/decorators/current-user.decorator.js';
import { sniffImage } from '../../common/util/image-sniff.js';
import { CardImage } from './card-image.entity.js';

/** The body of a request, read whole but never beyond `maxBytes` (413 as soon as it is passed). */
export function readLimited(stream: Readable, maxBytes: number): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    const parts: Buffer[] = [];
    let size = 0;
    let done = false;
    const tooLarge = () =>
      new HttpException(
        {
          statusCode: 413,
          error: 'Payload Too Large',
          message: `The image is larger than ${Math.floor(maxBytes / 1024 / 1024)} MB (${maxBytes} bytes); send a smaller photo or scan.`,
        },
        413,
      );
    stream.on('data', (c: Buffer) => {
      if (done) return;
      size += c.length;
      if (size > maxBytes) {
        done = true;
        stream.resume(); // drain the rest so the answer can be sent
        reject(tooLarge());
        return;
      }
      parts.push(c);
    });
    stream.on('end', () => {
      if (!done) resolve(Buffer.concat(parts));
    });
    stream.on('error', (e) => {
      if (!done) reject(e);
    });
  });
}

/** Photos and scans of indicator cards: checked by their bytes, kept in the object store. */
@Injectable()
export class CardImagesService {
  constructor(
    @InjectRepository(CardImage) private readonly cardImageRepo: Repository<CardImage>,
    private readonly storage: StorageService,
    private readonly runs: RunsService,
    private readonly config: AppConfig,
  ) {}

  get maxBytes(): number {
    return this.config.get('UPLOAD_MAX_BYTES');
  }

  toDto(i: CardImage): CardImageDto {
    return {
      id: i.id,
      runId: i.runId,
      contentType: i.contentType,
      bytes: i.bytes,
      widthPx: i.widthPx,
      heightPx: i.heightPx,
      uploadedAt: i.uploadedAt.toISOString(),
    };
  }

  /** Stores an image for a run's cards; refuses anything that is not a PNG, JPEG or WebP image by its content. */
  async upload(runId: string, body: Buffer, user: AuthUser): Promise<CardImageDto> {
    const run = await this.runs.get(runId);
    this.runs.assertOpen(run);
    return this.store(runId, body, user.id);
  }

  /** Also used by the demo seed, for runs already closed. */
  async store(runId: string, body: Buffer, userId: string): Promise<CardImageDto> {
    if (body.length === 0) throw new BadRequestException('The request holds no image. Send the photo or scan itself as the body.');
    if (body.length > this.maxBytes)
      throw new HttpException(
        { statusCode: 413, error: 'Payload Too Large', message: `The image is larger than ${this.maxBytes} bytes.` },
        413,
      );
    const sniffed = await sniffImage(body);
    if (!sniffed) {
      throw new UnsupportedMediaTypeException(
        'That file is not a PNG, JPEG or WebP image (checked by its content, not its name). Photograph or scan the card as one of those.',
      );
    }
    const sha256 = createHash('sha256').update(body).digest('hex');
    const id = randomUUID();
    const storageKey = `runs/${runId}/cards/${id}.${sniffed.contentType.split('/')[1]}`;
    await this.storage.put(storageKey, body, sniffed.contentType);
    const saved = await this.cardImageRepo.save(
      this.cardImageRepo.create({
        id,
        runId,
        storageKey,
        contentType: sniffed.contentType,
        bytes: body.length,
        widthPx: sniffed.widthPx,
        heightPx: sniffed.heightPx,
        sha256,
        uploadedBy: userId,
        uploadedAt: new Date(),
      }),
    );
    return this.toDto(saved);
  }

  async meta(id: string): Promise<CardImage> {
    const i = await this.cardImageRepo.findOne({ where: { id } });
    if (!i) throw new NotFoundException('No such card image.');
    return i;
  }

  async content(id: string): Promise<{ image: CardImage; body: Buffer }> {
    const image = await this.meta(id);
    try {
      const { body } = await this.storage.get(image.storageKey);
      return { image, body };
    } catch (e) {
      const name = (e as { name?: string }).name;
      if (name === 'NoSuchKey' || name === 'NotFound')
        throw new NotFoundException('The image is recorded but missing from the object store.');
      throw e;
    }
  }

  /** An image already stored for the same run, by content hash (the seed uses it to stay idempotent). */
  findByHash(runId: string, sha256: string): Promise<CardImage | null> {
    return this.cardImageRepo.findOne({ where: { runId, sha256 } });
  }
}
