import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs/promises';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { CreateMultipartUploadCommand, S3Client, UploadPartCommand } from '@aws-sdk/client-s3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createLogger } from '@server/logger';
import { UnitOfWork } from '@server/repositories/unit-of-work';
import { StorageJanitor } from '@server/services/storage-janitor';
import { startStanceline } from '@server/start';
import { signInOver, startServerProcess } from '../helpers/server-process';
import { createTestServer, type TestServer } from '../helpers/server-harness';
import { removeRenderedVideos, renderVideo, settled, uploadClip } from './clip-fixtures';

// What a server killed mid-upload leaves behind, and the sweep that removes it.

let server: TestServer;

beforeAll(async () => {
  server = await createTestServer();
});
afterAll(async () => {
  await server.close();
  await removeRenderedVideos();
});

/** A pid no process has: above the highest pid this kernel hands out. */
async function deadPid(): Promise<number> {
  const max = Number((await fs.readFile('/proc/sys/kernel/pid_max', 'utf8').catch(() => '4194304')).trim());
  return max + 1;
}

describe('storage janitor', () => {
  it('removes scratch files of dead processes, incomplete multipart uploads and objects of no clip', async () => {
    const { config, runtime } = server;
    const video = await renderVideo('h264-mp4', { seconds: 1 });
    const kept = await settled(
      server,
      (
        await uploadClip(server, video.path, {
          sessionId: (await server.sessionIds())[0],
          athleteIds: await server.athleteId('Elsie'),
          view: 'front',
        })
      ).id,
    );
    const keptKeys = (await runtime.storage.listKeys('clubs/')).filter((k) => k.includes(kept.id));
    expect(keptKeys.length).toBeGreaterThan(0);

    // A scratch file of a process that no longer exists, and one of a live process (this one's parent).
    await fs.mkdir(config.uploadTempDir, { recursive: true });
    const dead = path.join(config.uploadTempDir, `${await deadPid()}-crashed.part`);
    const live = path.join(config.uploadTempDir, `${process.ppid}-streaming.part`);
    await fs.writeFile(dead, Buffer.alloc(1024));
    await fs.writeFile(live, Buffer.alloc(1024));
    // An object stored for a clip whose row was never written (killed between the two).
    const orphanKey = `clubs/club/clips/00000000-0000-4000-8000-00000000dead/original.mp4`;
    await runtime.storage.putFile(orphanKey, video.path, 'video/mp4');
    // A multipart upload begun and never completed.
    const s3 = new S3Client({
      endpoint: runtime.s3Endpoint,
      region: config.s3.region,
      forcePathStyle: true,
      credentials: { accessKeyId: config.s3.accessKeyId, secretAccessKey: config.s3.secretAccessKey },
    });
    const started = await s3.send(
      new CreateMultipartUploadCommand({ Bucket: config.s3.bucket, Key: 'clubs/club/clips/x/original.mp4' }),
    );
    await s3.send(
      new UploadPartCommand({
        Bucket: config.s3.bucket,
        Key: 'clubs/club/clips/x/original.mp4',
        UploadId: started.UploadId,
        PartNumber: 1,
        Body: Buffer.alloc(64 * 1024),
      }),
    );
    s3.destroy();
    const partsDir = path.join(config.s3.embeddedDir, config.s3.bucket, '._S3rver_uploads');
    expect(await fs.readdir(partsDir)).toHaveLength(1);

    const janitor = new StorageJanitor({
      uow: new UnitOfWork(runtime.dataSource),
      storage: runtime.storage,
      uploadTempDir: config.uploadTempDir,
      logger: createLogger('silent'),
      clock: server.clock,
      sweepStandInUploads: runtime.sweepStandInUploads,
    });

    // With a day's grace, only the dead process's scratch file goes: the rest may be work in progress.
    expect(await janitor.sweep(24 * 3_600_000)).toEqual({
      tempFiles: 1,
      incompleteUploads: 0,
      orphanObjects: 0,
    });
    expect(await runtime.storage.exists(orphanKey)).toBe(true);

    // As at the start of a lone server: everything left behind goes, and nothing a clip refers to.
    expect(await janitor.sweep(0)).toEqual({ tempFiles: 0, incompleteUploads: 1, orphanObjects: 1 });
    expect(await runtime.storage.exists(orphanKey)).toBe(false);
    for (const key of keptKeys) expect(await runtime.storage.exists(key)).toBe(true);
    expect(await fs.readdir(partsDir)).toHaveLength(0);
    expect(await fs.readdir(config.uploadTempDir)).toEqual([path.basename(live)]);
    await fs.rm(live);
  });
});

describe('a server killed while a clip streams in', () => {
  let child: ChildProcess | undefined;
  let dataDir: string;

  beforeAll(async () => {
    dataDir = await fs.mkdtemp(path.join(os.tmpdir(), 'stanceline-crash-'));
  });
  afterAll(async () => {
    child?.kill('SIGKILL');
    await fs.rm(dataDir, { recursive: true, force: true });
  });

  it('leaves no scratch file behind after its next start', { timeout: 120_000 }, async () => {
    const started = await startServerProcess(dataDir);
    child = started.child;
    const base = started.base;
    const auth = await signInOver(base, 'coach@larchwood.example');
    const sessions = (await (await fetch(`${base}/api/sessions`, { headers: auth })).json()) as {
      sessions: { id: string }[];
    };
    const athletes = (await (await fetch(`${base}/api/athletes`, { headers: auth })).json()) as {
      athletes: { id: string; firstName: string }[];
    };
    const elsie = athletes.athletes.find((a) => a.firstName === 'Elsie')!;

    // A clip that streams in slowly: fields, then the start of an MP4, then more bytes in pieces.
    const boundary = 'crashboundary';
    const head =
      `--${boundary}\r\nContent-Disposition: form-data; name="sessionId"\r\n\r\n${sessions.sessions[0].id}\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="athleteIds"\r\n\r\n${elsie.id}\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="view"\r\n\r\nfront\r\n` +
      `--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="run.mp4"\r\nContent-Type: video/mp4\r\n\r\n`;
    const request = http.request(`${base}/api/clips`, {
      method: 'POST',
      headers: { ...auth, 'Content-Type': `multipart/form-data; boundary=${boundary}` },
    });
    request.on('error', () => undefined);
    request.write(head);
    const scratch = path.join(dataDir, 'uploads-tmp');
    for (let i = 0; i < 40; i++) {
      request.write(Buffer.alloc(256 * 1024, i));
      await new Promise((r) => setTimeout(r, 25));
    }
    const during = await fs.readdir(scratch);
    expect(during.some((f) => f.endsWith('.part'))).toBe(true);

    child.kill('SIGKILL');
    await new Promise((r) => child!.once('exit', r));
    request.destroy();
    expect((await fs.readdir(scratch)).some((f) => f.endsWith('.part'))).toBe(true);

    const again = await startStanceline({
      port: 0,
      dataDir,
      logLevel: 'silent',
      env: { BCRYPT_ROUNDS: '4' },
    });
    try {
      expect(await fs.readdir(scratch)).toEqual([]);
    } finally {
      await again.close();
    }
  });
});

describe('child processes of a crashed server', () => {
  it('die with it (an encode does not go on for nobody)', { timeout: 30_000 }, async () => {
    const parent = spawn(process.execPath, ['--import', 'tsx', 'tests/server/fixtures/spawn-child.ts'], {
      stdio: ['ignore', 'pipe', 'inherit'],
    });
    const childPid = await new Promise<number>((resolve) =>
      parent.stdout!.once('data', (chunk: Buffer) => resolve(Number(String(chunk).trim()))),
    );
    const alive = (pid: number) => {
      try {
        process.kill(pid, 0);
        return true;
      } catch {
        return false;
      }
    };
    expect(alive(childPid)).toBe(true);
    parent.kill('SIGKILL');
    await new Promise((r) => parent.once('exit', r));
    const deadline = Date.now() + 5000;
    while (alive(childPid) && Date.now() < deadline) await new Promise((r) => setTimeout(r, 50));
    const survived = alive(childPid);
    if (survived) process.kill(childPid, 'SIGKILL');
    expect(survived).toBe(false);
  });
});

describe('a clip whose processing a crash interrupted', () => {
  it('is picked up again once, and fails with a reason after a second interruption', async () => {
    const video = await renderVideo('h264-mp4', { seconds: 1 });
    const fields = {
      sessionId: (await server.sessionIds())[0],
      athleteIds: await server.athleteId('Elsie'),
      view: 'front' as const,
    };
    const once = await settled(server, (await uploadClip(server, video.path, fields)).id);
    const twice = await settled(server, (await uploadClip(server, video.path, fields)).id);
    // As a crash leaves them: still "processing", begun once and twice.
    await server.runtime.dataSource.query(
      `UPDATE clip SET status = 'processing', processingStarts = 1 WHERE id = ?`,
      [once.id],
    );
    await server.runtime.dataSource.query(
      `UPDATE clip SET status = 'processing', processingStarts = 2 WHERE id = ?`,
      [twice.id],
    );
    expect(await server.runtime.mediaQueue.resume()).toBe(2);
    await server.runtime.mediaQueue.idle();
    const auth = await server.bearer('coach');
    const first = (await server.http.get(`/api/clips/${once.id}`).set(auth)).body.clip;
    const second = (await server.http.get(`/api/clips/${twice.id}`).set(auth)).body.clip;
    expect(first.status).toBe('ready');
    expect(second.status).toBe('failed');
    expect(second.failureReason).toMatch(/stopped twice while preparing this clip/);
  });
});
