import fs from 'node:fs/promises';
import S3rver from 's3rver';

export interface EmbeddedS3 {
  endpoint: string;
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
  return {
    endpoint: `http://127.0.0.1:${address.port}`,
    async close() {
      // The SDK keeps sockets alive; without this, close() waits for them to time out.
      server.httpServer?.closeAllConnections();
      await server.close();
    },
  };
}
