import fs from 'node:fs';
import type { Readable } from 'node:stream';
import {
  CreateBucketCommand,
  DeleteObjectCommand,
  GetObjectCommand,
  HeadBucketCommand,
  HeadObjectCommand,
  PutObjectCommand,
  ListObjectsV2Command,
  S3Client,
  type S3ClientConfig,
  AbortMultipartUploadCommand,
  ListMultipartUploadsCommand,
} from '@aws-sdk/client-s3';
import { Upload } from '@aws-sdk/lib-storage';

export interface StorageSettings {
  endpoint: string;
  region: string;
  bucket: string;
  accessKeyId: string;
  secretAccessKey: string;
}

export interface ObjectRange {
  start: number;
  end: number;
}

/** Clip media in an S3-compatible bucket (path-style, so local fakes and MinIO-like stores work). */
export class ObjectStorage {
  private readonly client: S3Client;
  readonly bucket: string;

  constructor(settings: StorageSettings) {
    const config: S3ClientConfig = {
      endpoint: settings.endpoint,
      region: settings.region,
      forcePathStyle: true,
      credentials: { accessKeyId: settings.accessKeyId, secretAccessKey: settings.secretAccessKey },
      // Stores without the newer checksum headers (s3rver among them) reject them otherwise.
      requestChecksumCalculation: 'WHEN_REQUIRED',
      responseChecksumValidation: 'WHEN_REQUIRED',
    };
    this.client = new S3Client(config);
    this.bucket = settings.bucket;
  }

  async ensureBucket(): Promise<void> {
    try {
      await this.client.send(new HeadBucketCommand({ Bucket: this.bucket }));
    } catch {
      await this.client.send(new CreateBucketCommand({ Bucket: this.bucket }));
    }
  }

  /** Streams a local file up (multipart for large files), never holding it in memory. */
  async putFile(key: string, filePath: string, contentType: string): Promise<void> {
    const upload = new Upload({
      client: this.client,
      params: {
        Bucket: this.bucket,
        Key: key,
        Body: fs.createReadStream(filePath),
        ContentType: contentType,
      },
      queueSize: 2,
      partSize: 8 * 1024 * 1024,
    });
    await upload.done();
  }

  /** A small object held in memory already (a still of a few hundred kB). */
  async putBuffer(key: string, body: Buffer, contentType: string): Promise<void> {
    await this.client.send(
      new PutObjectCommand({ Bucket: this.bucket, Key: key, Body: body, ContentType: contentType }),
    );
  }

  async getStream(key: string, range?: ObjectRange): Promise<Readable> {
    const result = await this.client.send(
      new GetObjectCommand({
        Bucket: this.bucket,
        Key: key,
        Range: range ? `bytes=${range.start}-${range.end}` : undefined,
      }),
    );
    if (!result.Body) throw new Error(`Object ${key} has no body`);
    return result.Body as Readable;
  }

  async exists(key: string): Promise<boolean> {
    try {
      await this.client.send(new HeadObjectCommand({ Bucket: this.bucket, Key: key }));
      return true;
    } catch (error) {
      if ((error as { name?: string }).name === 'NotFound') return false;
      throw error;
    }
  }

  async delete(key: string): Promise<void> {
    await this.client.send(new DeleteObjectCommand({ Bucket: this.bucket, Key: key }));
  }

  /** Every object under a prefix with its last change (paginated); for maintenance, not request paths. */
  async listObjects(prefix = ''): Promise<{ key: string; lastModified: Date }[]> {
    const objects: { key: string; lastModified: Date }[] = [];
    let token: string | undefined;
    do {
      const page = await this.client.send(
        new ListObjectsV2Command({ Bucket: this.bucket, Prefix: prefix, ContinuationToken: token }),
      );
      for (const item of page.Contents ?? []) {
        if (item.Key) objects.push({ key: item.Key, lastModified: item.LastModified ?? new Date(0) });
      }
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
    return objects;
  }

  /**
   * Aborts multipart uploads begun before `before` (their parts are stored and billed but belong to no
   * object). Null when the store cannot list them through the API (the local stand-in).
   */
  async abortIncompleteUploads(before: Date): Promise<number | null> {
    let aborted = 0;
    let keyMarker: string | undefined;
    let uploadIdMarker: string | undefined;
    try {
      do {
        const page = await this.client.send(
          new ListMultipartUploadsCommand({
            Bucket: this.bucket,
            KeyMarker: keyMarker,
            UploadIdMarker: uploadIdMarker,
          }),
        );
        for (const upload of page.Uploads ?? []) {
          if (!upload.Key || !upload.UploadId || !upload.Initiated || upload.Initiated >= before) continue;
          await this.client.send(
            new AbortMultipartUploadCommand({
              Bucket: this.bucket,
              Key: upload.Key,
              UploadId: upload.UploadId,
            }),
          );
          aborted++;
        }
        keyMarker = page.IsTruncated ? page.NextKeyMarker : undefined;
        uploadIdMarker = page.IsTruncated ? page.NextUploadIdMarker : undefined;
      } while (keyMarker);
    } catch (error) {
      if ((error as { name?: string }).name === 'NotImplemented') return null;
      throw error;
    }
    return aborted;
  }

  /** Every key under a prefix (paginated); for maintenance and tests, not request paths. */
  async listKeys(prefix = ''): Promise<string[]> {
    const keys: string[] = [];
    let token: string | undefined;
    do {
      const page = await this.client.send(
        new ListObjectsV2Command({ Bucket: this.bucket, Prefix: prefix, ContinuationToken: token }),
      );
      for (const item of page.Contents ?? []) if (item.Key) keys.push(item.Key);
      token = page.IsTruncated ? page.NextContinuationToken : undefined;
    } while (token);
    return keys;
  }

  async ping(): Promise<void> {
    await this.client.send(new HeadBucketCommand({ Bucket: this.bucket }));
  }

  close(): void {
    this.client.destroy();
  }
}
