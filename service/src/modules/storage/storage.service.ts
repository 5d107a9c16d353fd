import { Injectable, Logger, type OnModuleInit } from '@nestjs/common';
import { CreateBucketCommand, GetObjectCommand, HeadBucketCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { AppConfig } from '../../config/app-config.service.js';

/** Object storage through the S3 SDK; locally an S3-compatible stand-in on 127.0.0.1. */
@Injectable()
export class StorageService implements OnModuleInit {
  private readonly logger = new Logger('Storage');
  private readonly client: S3Client;
  private readonly bucket: string;

  constructor(config: AppConfig) {
    this.bucket = config.get('S3_BUCKET');
    this.client = new S3Client({
      endpoint: config.get('S3_ENDPOINT'),
      region: config.get('S3_REGION'),
      forcePathStyle: true,
      credentials: { accessKeyId: config.get('S3_ACCESS_KEY_ID'), secretAccessKey: config.get('S3_SECRET_ACCESS_KEY') },
      // Without these the SDK frames uploads as aws-chunked, which the local stand-in stores verbatim.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    });
  }

  async onModuleInit() {
    try {
      await this.client.send(new HeadBucketCommand({ Bucket: this.bucket }));
    } catch {
      try {
        await this.client.send(new CreateBucketCommand({ Bucket: this.bucket }));
      } catch (e) {
        this.logger.warn(`object store not reachable yet: ${(e as Error).message}`);
      }
    }
  }

  async put(key: string, body: Buffer, contentType: string): Promise<void> {
    await this.client.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: body, ContentType: contentType }));
  }

  async get(key: string): Promise<{ body: Buffer; contentType: string }> {
    const r = await this.client.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
    const bytes = await r.Body!.transformToByteArray();
    return { body: Buffer.from(bytes), contentType: r.ContentType ?? 'application/octet-stream' };
  }
}
