import { Transform, type TransformCallback } from 'node:stream';
import { BadRequestException, HttpException } from '@nestjs/common';

const NEWLINE = 0x0a;

/**
 * Sits between an upload and the CSV parser. Counts the bytes as they arrive (so a chunked body without a
 * Content-Length is capped too), refuses a line longer than `maxLineBytes`, and passes on only whole lines,
 * so the parser never re-reads an ever-growing partial line (its work stays linear in the file's size).
 * A refusal is an HttpException given to `onRefused`; the caller stops reading and answers with it.
 */
export class CsvLineLimiter extends Transform {
  private bytes = 0;
  /** The physical line (1-based) the next byte belongs to. */
  private line = 1;
  /** The start of the current, unfinished line, held until its newline comes. */
  private pending: Buffer[] = [];
  private pendingBytes = 0;
  refusal: HttpException | null = null;

  constructor(
    private readonly maxBytes: number,
    private readonly maxLineBytes: number,
  ) {
    super();
  }

  override _transform(chunk: Buffer, _enc: BufferEncoding, done: TransformCallback): void {
    if (this.refusal) return done();
    this.bytes += chunk.length;
    if (this.bytes > this.maxBytes) {
      const mb = Math.round(this.maxBytes / (1024 * 1024));
      return this.refuse(
        new HttpException({ statusCode: 413, error: 'Payload Too Large', message: `The file is larger than ${mb} MB; split it.` }, 413),
        done,
      );
    }
    let start = 0;
    let lastWhole = -1;
    for (let nl = chunk.indexOf(NEWLINE); nl !== -1; nl = chunk.indexOf(NEWLINE, nl + 1)) {
      const length = (start === 0 ? this.pendingBytes : 0) + (nl - start);
      if (length > this.maxLineBytes) return this.refuse(this.tooLong(), done);
      this.line++;
      start = nl + 1;
      lastWhole = nl;
    }
    const tail = chunk.length - start;
    if ((lastWhole === -1 ? this.pendingBytes : 0) + tail > this.maxLineBytes) return this.refuse(this.tooLong(), done);
    if (lastWhole === -1) {
      this.pending.push(chunk);
      this.pendingBytes += chunk.length;
      return done();
    }
    const whole = Buffer.concat([...this.pending, chunk.subarray(0, lastWhole + 1)]);
    this.pending = tail ? [chunk.subarray(lastWhole + 1)] : [];
    this.pendingBytes = tail;
    done(null, whole);
  }

  override _flush(done: TransformCallback): void {
    if (this.refusal) return done();
    done(null, this.pendingBytes ? Buffer.concat(this.pending) : undefined);
  }

  private tooLong(): HttpException {
    const kb = Math.round(this.maxLineBytes / 1024);
    return new BadRequestException(
      `Line ${this.line} is longer than ${kb} kB; a reading needs one short line (taken_at, point, value). ` +
        'Check that the file has line breaks and that every quote is closed.',
    );
  }

  private refuse(e: HttpException, done: TransformCallback): void {
    this.refusal = e;
    this.pending = [];
    this.pendingBytes = 0;
    done();
    this.emit('refused', e);
  }
}
