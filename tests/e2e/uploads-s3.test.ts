import { mkdtempSync, rmSync } from 'node:fs'
import { tmpdir } from 'node:os'
import { join } from 'node:path'
import { afterAll, beforeAll, describe, expect, it, inject } from 'vitest'
import { CreateBucketCommand, GetObjectCommand, ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3'
// @ts-expect-error s3rver ships no types
import S3rver from 's3rver'
import { freePort, startBuiltServer } from './support/server'
import { DEMO_PASSWORD, demo, freshAddress } from './support/api'
import { download, makePdf, makePng, upload } from './support/files'

// The S3-compatible storage path, against a local fake of the service (s3rver) that this
// test starts itself, with a second server of the same build pointed at it.
const BUCKET = 'rootplate-test-uploads'
const credentials = { accessKeyId: 'S3RVER', secretAccessKey: 'S3RVER' } // s3rver's documented default keys
let fake: { run: () => Promise<unknown>; close: () => Promise<void> }
let dir = ''
let endpoint = ''
let s3: S3Client
let server: { baseUrl: string; stop: () => Promise<void> }
let cookie = ''
let designId = ''

beforeAll(async () => {
  dir = mkdtempSync(join(tmpdir(), 'rootplate-s3-'))
  const port = await freePort()
  fake = new S3rver({ port, address: '127.0.0.1', silent: true, directory: dir })
  await fake.run()
  endpoint = `http://127.0.0.1:${port}`
  s3 = new S3Client({ endpoint, region: 'us-east-1', forcePathStyle: true, credentials })
  await s3.send(new CreateBucketCommand({ Bucket: BUCKET }))
  server = await startBuiltServer({
    DATABASE_URL: inject('databaseUrl'),
    NUXT_TRUST_PROXY: '1',
    NUXT_SESSION_PASSWORD: process.env.NUXT_SESSION_PASSWORD ?? 'test-session-password-of-at-least-32-chars',
    UPLOADS_DRIVER: 's3',
    UPLOADS_S3_ENDPOINT: endpoint,
    UPLOADS_S3_BUCKET: BUCKET,
    UPLOADS_S3_REGION: 'us-east-1',
    UPLOADS_S3_ACCESS_KEY_ID: credentials.accessKeyId,
    UPLOADS_S3_SECRET_ACCESS_KEY: credentials.secretAccessKey,
    UPLOADS_S3_PREFIX: 'shops',
  })
  const login = await fetch(`${server.baseUrl}/api/auth/login`, {
    method: 'POST', headers: { 'content-type': 'application/json', 'x-forwarded-for': freshAddress() },
    body: JSON.stringify({ email: demo.designer, password: DEMO_PASSWORD }),
  })
  cookie = login.headers.getSetCookie().map(c => c.split(';')[0]).join('; ')
  const created = await fetch(`${server.baseUrl}/api/designs`, { method: 'POST', headers: { cookie, 'content-type': 'application/json' }, body: JSON.stringify({ name: 'S3 test stump', params: {} }) })
  designId = (await created.json()).id
}, 120_000)

afterAll(async () => {
  await server?.stop()
  s3?.destroy()
  await fake?.close()
  if (dir) rmSync(dir, { recursive: true, force: true })
})

async function objectKeys(): Promise<string[]> {
  const res = await s3.send(new ListObjectsV2Command({ Bucket: BUCKET }))
  return (res.Contents ?? []).map(o => o.Key!).sort()
}

describe('uploads on an S3-compatible bucket', () => {
  it('stores the bytes as an object in the bucket, read back byte-identical through the API and straight from the bucket', async () => {
    const png = makePng(120, 80, [{ x: 30, y: 40, r: 10 }])
    const res = await upload(`/api/designs/${designId}/attachments`, png, 'photo.png', { cookie, base: server.baseUrl })
    expect(res.status).toBe(201)
    const keys = await objectKeys()
    expect(keys.some(k => k.startsWith('shops/') && k.endsWith(res.body.id))).toBe(true)
    const key = keys.find(k => k.endsWith(res.body.id))!
    // Read with the SDK directly, not through our driver.
    const direct = await s3.send(new GetObjectCommand({ Bucket: BUCKET, Key: key }))
    expect(Buffer.from(await direct.Body!.transformToByteArray()).equals(Buffer.from(png))).toBe(true)
    const back = await download(res.body.url, cookie, server.baseUrl)
    expect(back.status).toBe(200)
    expect(back.type).toBe('image/png')
    expect(Buffer.from(back.bytes).equals(Buffer.from(png))).toBe(true)

    const pdf = await makePdf()
    const p = await upload(`/api/designs/${designId}/attachments`, pdf, 'sheet.pdf', { cookie, base: server.baseUrl })
    expect(p.status).toBe(201)
    expect(Buffer.from((await download(p.body.url, cookie, server.baseUrl)).bytes).equals(Buffer.from(pdf))).toBe(true)
  })

  it('refuses oversized and wrong files with nothing put in the bucket, and removes the object with the file', async () => {
    const before = await objectKeys()
    const big = new Uint8Array(15 * 1024 * 1024 + 1)
    big.set(makePng(4, 4))
    expect((await upload(`/api/designs/${designId}/attachments`, big, 'huge.png', { cookie, base: server.baseUrl })).status).toBe(413)
    expect((await upload(`/api/designs/${designId}/attachments`, new TextEncoder().encode('#!/bin/sh\necho hi\n'), 'run.png', { cookie, base: server.baseUrl })).status).toBe(415)
    expect(await objectKeys()).toEqual(before)

    const res = await upload(`/api/designs/${designId}/attachments`, makePng(10, 10), 'gone.png', { cookie, base: server.baseUrl })
    expect((await objectKeys()).length).toBe(before.length + 1)
    const del = await fetch(`${server.baseUrl}/api/attachments/${res.body.id}`, { method: 'DELETE', headers: { cookie } })
    expect(del.status).toBe(204)
    expect(await objectKeys()).toEqual(before)
  })
})
