import { Inject, Injectable, ServiceUnavailableException } from '@nestjs/common';
import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3';
import { randomUUID } from 'node:crypto';
import type { Readable } from 'node:stream';
import { CONFIG, type AppConfig } from '../config';

// The SDK warns on every start that future releases will need Node 22; we pin a version that runs on 20.
process.env.AWS_SDK_JS_NODE_VERSION_SUPPORT_WARNING_DISABLED ??= 'true';

/** Object storage through the real S3 SDK (the local fake in demo and tests). Keys are random. */
@Injectable()
export class StorageService {
  private readonly s3: S3Client;
  private readonly bucket: string;

  constructor(@Inject(CONFIG) cfg: AppConfig) {
    this.bucket = cfg.S3_BUCKET;
    this.s3 = new S3Client({
      endpoint: cfg.S3_ENDPOINT,
      region: cfg.S3_REGION,
      forcePathStyle: true,
      credentials: { accessKeyId: cfg.S3_ACCESS_KEY, secretAccessKey: cfg.S3_SECRET_KEY },
      // The fake stores streamed uploads wrongly with the newer default checksums.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
      maxAttempts: 2,
    });
  }

  newKey(prefix: string): string {
    return `${prefix}/${randomUUID()}`;
  }

  async put(key: string, body: Buffer, contentType: string): Promise<void> {
    try {
      await this.s3.send(new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: body, ContentType: contentType, ContentLength: body.length }));
    } catch {
      throw new ServiceUnavailableException({ error: 'unavailable', message: 'File storage is not reachable right now. Nothing was saved; try again shortly.' });
    }
  }

  async get(key: string): Promise<{ body: Readable; contentType: string; length?: number }> {
    try {
      const r = await this.s3.send(new GetObjectCommand({ Bucket: this.bucket, Key: key }));
      return { body: r.Body as Readable, contentType: r.ContentType ?? 'application/octet-stream', length: r.ContentLength };
    } catch (err) {
      const name = (err as { name?: string }).name;
      if (name === 'NoSuchKey') throw new ServiceUnavailableException({ error: 'unavailable', message: 'The stored file is missing' });
      throw new ServiceUnavailableException({ error: 'unavailable', message: 'File storage is not reachable right now. Try again shortly.' });
    }
  }

  async delete(key: string): Promise<void> {
    await this.s3.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key })).catch(() => undefined);
  }
}
