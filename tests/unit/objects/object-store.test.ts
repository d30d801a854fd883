// Both object stores against the same expectations: the storage folder, and the S3 client against the fake S3
// server of scripts/fake-s3.mjs.
import { randomBytes } from 'node:crypto';
import { mkdtempSync, readdirSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readS3Settings } from '@/lib/objects/config';
import { LocalObjectStore } from '@/lib/objects/local-store';
import { ObjectMissingError, type ObjectStore, ObjectWriteError, readObjectBytes, removePrefix } from '@/lib/objects/object-store';
import { S3ObjectStore } from '@/lib/objects/s3-store';
import { type FakeS3, startFakeS3 } from '../../support/scale-services';

let fake: FakeS3;
beforeAll(async () => {
  fake = await startFakeS3();
});
afterAll(async () => {
  await fake?.stop();
});

const stores: Array<[string, () => ObjectStore]> = [
  ['local folder', () => new LocalObjectStore(mkdtempSync(path.join(os.tmpdir(), 'splitfield-objects-')))],
  ['S3 bucket', () => new S3ObjectStore(readS3Settings({ ...fake.env, SPLITFIELD_S3_PREFIX: `t${Date.now()}/` })!)],
];

describe.each(stores)('object store: %s', (_name, make) => {
  it('writes, reads whole and by range, sizes, lists and removes', async () => {
    const store = make();
    await store.put('samples/7/a.f64', Buffer.from('0123456789'));
    await store.put('samples/7/manifest.json', '{"x":1}');
    await store.put('uploads/u.upload', Readable.from([Buffer.from('abc'), Buffer.from('def')]));
    expect((await readObjectBytes(store, 'samples/7/a.f64')).toString()).toBe('0123456789');
    expect((await readObjectBytes(store, 'samples/7/a.f64', { start: 3, end: 7 })).toString()).toBe('3456');
    expect((await readObjectBytes(store, 'uploads/u.upload')).toString()).toBe('abcdef');
    expect(await store.size('samples/7/a.f64')).toBe(10);
    expect(await store.size('samples/7/none')).toBeNull();
    expect(await store.list('samples/')).toEqual(['samples/7/a.f64', 'samples/7/manifest.json']);
    await removePrefix(store, 'samples/7/');
    expect(await store.list('samples/')).toEqual([]);
    await expect(store.read('samples/7/a.f64')).rejects.toBeInstanceOf(ObjectMissingError);
    await store.remove(['uploads/u.upload', 'uploads/never-there']);
    expect(await store.list('uploads/')).toEqual([]);
  });

  it('streams an object larger than one multipart part and reads it back unchanged', async () => {
    const store = make();
    const bytes = randomBytes(9 * 1024 * 1024 + 17);
    const chunks = Array.from({ length: Math.ceil(bytes.length / 65536) }, (_, k) => bytes.subarray(k * 65536, (k + 1) * 65536));
    await store.put('uploads/big.upload', Readable.from(chunks));
    expect(await store.size('uploads/big.upload')).toBe(bytes.length);
    expect((await readObjectBytes(store, 'uploads/big.upload')).equals(bytes)).toBe(true);
    const middle = await readObjectBytes(store, 'uploads/big.upload', { start: 8 * 1024 * 1024 - 5, end: 8 * 1024 * 1024 + 5 });
    expect(middle.equals(bytes.subarray(8 * 1024 * 1024 - 5, 8 * 1024 * 1024 + 5))).toBe(true);
  });

  it('leaves no object when the stream being written fails', async () => {
    const store = make();
    const failing = new Readable({
      read() {
        this.push(Buffer.alloc(1024, 1));
        this.destroy(new Error('the client went away'));
      },
    });
    await expect(store.put('uploads/broken.upload', failing)).rejects.toBeInstanceOf(ObjectWriteError);
    expect(await store.list('uploads/')).toEqual([]);
    if (store instanceof LocalObjectStore) expect(readdirSync(path.join(store.root, 'uploads'))).toEqual([]);
  });

  it('refuses keys that leave the store', async () => {
    const store = make();
    for (const key of ['../x', '/abs', 'a//b', 'a/./b', '']) await expect(store.put(key, 'x')).rejects.toThrow();
  });
});

describe('S3 settings from the environment', () => {
  it('reads the variables and names a wrong one', () => {
    expect(readS3Settings({})).toBeNull();
    expect(readS3Settings(fake.env)).toMatchObject({ bucket: fake.bucket, pathStyle: true, region: 'us-east-1', prefix: '' });
    expect(() => readS3Settings({ SPLITFIELD_S3_ENDPOINT: 'http://x' })).toThrow(/SPLITFIELD_S3_ENDPOINT set without SPLITFIELD_S3_BUCKET/);
    expect(() => readS3Settings({ SPLITFIELD_S3_BUCKET: 'bucket', SPLITFIELD_S3_ACCESS_KEY_ID: 'k' })).toThrow(/SPLITFIELD_S3_SECRET_ACCESS_KEY/);
    expect(() => readS3Settings({ SPLITFIELD_S3_BUCKET: 'bucket', SPLITFIELD_S3_PATH_STYLE: 'yes' })).toThrow(/SPLITFIELD_S3_PATH_STYLE/);
    expect(() => readS3Settings({ SPLITFIELD_S3_BUCKET: 'bucket', SPLITFIELD_S3_PREFIX: 'no-slash' })).toThrow(/SPLITFIELD_S3_PREFIX/);
  });
});

describe('S3 listing', () => {
  it('lists past one page of 1000 keys', async () => {
    const store = new S3ObjectStore(readS3Settings({ ...fake.env, SPLITFIELD_S3_PREFIX: `many${Date.now()}/` })!);
    const keys = Array.from({ length: 1203 }, (_, k) => `work/1-1/shard-${String(k).padStart(4, '0')}`);
    for (let at = 0; at < keys.length; at += 50) await Promise.all(keys.slice(at, at + 50).map((key) => store.put(key, 'x')));
    expect(await store.list('work/1-1/')).toEqual(keys);
    await removePrefix(store, 'work/');
    expect(await store.list('work/')).toEqual([]);
  });
});
