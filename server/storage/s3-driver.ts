// An unstorage driver on the AWS SDK, for S3-compatible buckets (AWS, MinIO,
// Garage, a local fake in the tests). unstorage's own S3 driver needs a
// package we do not ship; the SDK is already a dependency.
import { DeleteObjectCommand, GetObjectCommand, HeadObjectCommand, ListObjectsV2Command, PutObjectCommand, S3Client, S3ServiceException } from '@aws-sdk/client-s3'
import { defineDriver } from 'unstorage'

export interface S3DriverOptions {
  bucket: string
  endpoint?: string
  region: string
  accessKeyId: string
  secretAccessKey: string
  /** Path-style addresses (`endpoint/bucket/key`), which most self-hosted services need. */
  forcePathStyle?: boolean
  prefix?: string
}

function missing(err: unknown): boolean {
  return err instanceof S3ServiceException && (err.$metadata.httpStatusCode === 404 || err.name === 'NoSuchKey' || err.name === 'NotFound')
}

export default defineDriver((options: S3DriverOptions) => {
  const client = new S3Client({
    region: options.region,
    endpoint: options.endpoint,
    forcePathStyle: options.forcePathStyle ?? true,
    credentials: { accessKeyId: options.accessKeyId, secretAccessKey: options.secretAccessKey },
  })
  const prefix = options.prefix ? `${options.prefix.replace(/\/+$/, '')}/` : ''
  // unstorage keys use ':' as the separator; objects read better with '/'.
  const objectKey = (key: string) => prefix + key.replace(/:/g, '/')
  const Bucket = options.bucket

  async function getBytes(key: string): Promise<Uint8Array | null> {
    try {
      const res = await client.send(new GetObjectCommand({ Bucket, Key: objectKey(key) }))
      return res.Body ? await res.Body.transformToByteArray() : new Uint8Array()
    }
    catch (err: unknown) {
      if (missing(err)) return null
      throw err
    }
  }

  async function put(key: string, body: Uint8Array | string) {
    await client.send(new PutObjectCommand({ Bucket, Key: objectKey(key), Body: body }))
  }

  return {
    name: 's3-sdk',
    options,
    async hasItem(key) {
      try {
        await client.send(new HeadObjectCommand({ Bucket, Key: objectKey(key) }))
        return true
      }
      catch (err: unknown) {
        if (missing(err)) return false
        throw err
      }
    },
    async getItem(key) {
      const bytes = await getBytes(key)
      return bytes ? new TextDecoder().decode(bytes) : null
    },
    getItemRaw: getBytes,
    async setItem(key, value) { await put(key, value) },
    async setItemRaw(key, value: Uint8Array) { await put(key, value) },
    async removeItem(key) {
      await client.send(new DeleteObjectCommand({ Bucket, Key: objectKey(key) }))
    },
    async getKeys(base) {
      const keys: string[] = []
      let token: string | undefined
      do {
        const res = await client.send(new ListObjectsV2Command({ Bucket, Prefix: objectKey(base ?? ''), ContinuationToken: token }))
        for (const o of res.Contents ?? []) if (o.Key) keys.push(o.Key.slice(prefix.length).replace(/\//g, ':'))
        token = res.IsTruncated ? res.NextContinuationToken : undefined
      } while (token)
      return keys
    },
    async clear(base) {
      const keys = await this.getKeys!(base ?? '', {})
      for (const k of keys) await client.send(new DeleteObjectCommand({ Bucket, Key: objectKey(k) }))
    },
    dispose() { client.destroy() },
  }
})
