import { resolve } from 'node:path'
import type { Driver } from 'unstorage'
import fsDriver from 'unstorage/drivers/fs'
import s3Driver from './s3-driver'

/**
 * The driver behind the 'uploads' storage mount, chosen by environment:
 * UPLOADS_DRIVER=s3 with UPLOADS_S3_* for an S3-compatible bucket, otherwise
 * the local disk under UPLOADS_DIR (default .data/uploads).
 */
export function uploadsDriver(env: NodeJS.ProcessEnv = process.env): Driver {
  if ((env.UPLOADS_DRIVER ?? 'fs') === 's3') {
    const need = ['UPLOADS_S3_BUCKET', 'UPLOADS_S3_ACCESS_KEY_ID', 'UPLOADS_S3_SECRET_ACCESS_KEY'] as const
    const absent = need.filter(k => !env[k])
    if (absent.length) throw new Error(`UPLOADS_DRIVER=s3 needs ${absent.join(', ')}`)
    return s3Driver({
      bucket: env.UPLOADS_S3_BUCKET!,
      endpoint: env.UPLOADS_S3_ENDPOINT || undefined,
      region: env.UPLOADS_S3_REGION || 'us-east-1',
      accessKeyId: env.UPLOADS_S3_ACCESS_KEY_ID!,
      secretAccessKey: env.UPLOADS_S3_SECRET_ACCESS_KEY!,
      forcePathStyle: env.UPLOADS_S3_PATH_STYLE !== '0',
      prefix: env.UPLOADS_S3_PREFIX || undefined,
    })
  }
  return fsDriver({ base: resolve(env.UPLOADS_DIR || '.data/uploads') })
}
