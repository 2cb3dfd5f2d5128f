import fs from 'node:fs/promises';
import path from 'node:path';
import S3rver from 's3rver';

export interface EmbeddedS3 {
  endpoint: string;
  /**
   * Removes multipart uploads begun before `before` and never completed. The stand-in does not list or
   * abort multipart uploads through the S3 API (a real store does), so it sweeps its own folder.
   */
  sweepIncompleteUploads(before: Date): Promise<number>;
  close(): Promise<void>;
}

/** Starts s3rver on loopback (random port unless given) with the clip bucket created. */
export async function startEmbeddedS3(opts: {
  directory: string;
  bucket: string;
  port?: number;
}): Promise<EmbeddedS3> {
  await fs.mkdir(opts.directory, { recursive: true });
  const server = new S3rver({
    address: '127.0.0.1',
    port: opts.port ?? 0,
    silent: true,
    directory: opts.directory,
    vhostBuckets: false,
    configureBuckets: [{ name: opts.bucket }],
  });
  const address = await server.run();
  // Where s3rver keeps the parts of multipart uploads in progress, one folder per upload id.
  const uploadsDir = path.join(opts.directory, opts.bucket, '._S3rver_uploads');
  return {
    endpoint: `http://127.0.0.1:${address.port}`,
    async sweepIncompleteUploads(before) {
      let removed = 0;
      for (const id of await fs.readdir(uploadsDir).catch(() => [] as string[])) {
        const dir = path.join(uploadsDir, id);
        const stat = await fs.stat(dir).catch(() => null);
        if (stat && stat.mtime < before) {
          await fs.rm(dir, { recursive: true, force: true });
          removed++;
        }
      }
      return removed;
    },
    async close() {
      // The SDK keeps sockets alive; without this, close() waits for them to time out.
      server.httpServer?.closeAllConnections();
      await server.close();
    },
  };
}
