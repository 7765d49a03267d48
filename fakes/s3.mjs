// A local S3: s3rver on 127.0.0.1 with one bucket, kept on disk in FAKE_S3_DIR.
import { existsSync, mkdirSync, readdirSync, readFileSync, realpathSync, rmSync, statSync } from 'node:fs'
import path from 'node:path'
import { pathToFileURL } from 'node:url'
import S3rver from 's3rver'
import { stopOnSignals } from '../scripts/lib/lifeline.mjs'
import { rootPath } from '../scripts/lib/paths.mjs'

// Browsers upload straight to the bucket with presigned URLs, so it must answer CORS preflights.
const CORS = `<CORSConfiguration>
  <CORSRule>
    <AllowedOrigin>*</AllowedOrigin>
    <AllowedMethod>GET</AllowedMethod>
    <AllowedMethod>HEAD</AllowedMethod>
    <AllowedMethod>PUT</AllowedMethod>
    <AllowedMethod>POST</AllowedMethod>
    <AllowedMethod>DELETE</AllowedMethod>
    <AllowedHeader>*</AllowedHeader>
    <ExposeHeader>ETag</ExposeHeader>
    <MaxAgeSeconds>3000</MaxAgeSeconds>
  </CORSRule>
</CORSConfiguration>`

const xml = text => String(text).replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;')

/**
 * ListParts and AbortMultipartUpload, which s3rver 3.7 lacks: an upload that resumes asks which
 * parts arrived, and an upload given up is removed. Runs before s3rver's own routes; parts are
 * read from s3rver's upload folder (a part counts once its checksum file is written).
 */
function multipartExtras(store) {
  return async (ctx, next) => {
    const uploadId = ctx.query.uploadId
    const match = /^\/([^/]+)\/(.+)$/.exec(ctx.path)
    if (typeof uploadId !== 'string' || !match || !['GET', 'DELETE'].includes(ctx.method)) return next()
    const [, bucket, key] = match
    const dir = path.join(store.getResourcePath(bucket, undefined, 'uploads'), path.basename(uploadId))
    if (!/^[\w-]+$/.test(uploadId) || !existsSync(path.join(dir, 'key'))) {
      ctx.status = 404
      ctx.type = 'application/xml'
      ctx.body = `<?xml version="1.0" encoding="UTF-8"?><Error><Code>NoSuchUpload</Code><Message>The specified upload does not exist.</Message><UploadId>${xml(uploadId)}</UploadId></Error>`
      return
    }
    if (ctx.method === 'DELETE') {
      rmSync(dir, { recursive: true, force: true })
      ctx.status = 204
      return
    }
    const parts = readdirSync(dir).filter(name => /^\d+\.md5$/.test(name)).map((name) => {
      const number = Number(name.slice(0, -4))
      const file = path.join(dir, String(number))
      const stat = statSync(file)
      return { number, etag: readFileSync(path.join(dir, name), 'utf8').trim(), size: stat.size, modified: stat.mtime.toISOString() }
    }).sort((a, b) => a.number - b.number)
    ctx.type = 'application/xml'
    ctx.body = `<?xml version="1.0" encoding="UTF-8"?>
<ListPartsResult xmlns="http://s3.amazonaws.com/doc/2006-03-01/"><Bucket>${xml(bucket)}</Bucket><Key>${xml(decodeURIComponent(key))}</Key><UploadId>${xml(uploadId)}</UploadId><PartNumberMarker>0</PartNumberMarker><NextPartNumberMarker>${parts.at(-1)?.number ?? 0}</NextPartNumberMarker><MaxParts>10000</MaxParts><IsTruncated>false</IsTruncated>${
  parts.map(p => `<Part><PartNumber>${p.number}</PartNumber><LastModified>${p.modified}</LastModified><ETag>"${p.etag}"</ETag><Size>${p.size}</Size></Part>`).join('')
}</ListPartsResult>`
  }
}

export function s3Settings(env = process.env) {
  return {
    port: Number(env.FAKE_S3_PORT || 4568),
    directory: rootPath(env.FAKE_S3_DIR, '.data/s3'),
    bucket: env.FAKE_S3_BUCKET || 'unscathed',
  }
}

export async function startFakeS3(env = process.env) {
  const { port, directory, bucket } = s3Settings(env)
  mkdirSync(directory, { recursive: true })
  const server = new S3rver({
    address: '127.0.0.1',
    port,
    directory,
    silent: true,
    configureBuckets: [{ name: bucket, configs: [CORS] }],
  })
  server.middleware.unshift(multipartExtras(server.store))
  try {
    await server.run()
  }
  catch (error) {
    if (error.code === 'EADDRINUSE') throw new Error(`fake S3: port ${port} is in use`, { cause: error })
    throw error
  }
  const url = `http://127.0.0.1:${port}`
  console.log(`fake S3     ${url}  bucket ${bucket}, files in ${directory}  (access key and secret: S3RVER)`)
  return {
    url,
    bucket,
    close() {
      const closed = server.close()
      // SDK clients keep connections alive; close() alone would wait for them.
      server.httpServer.closeAllConnections()
      return closed
    },
  }
}

if (process.argv[1] && pathToFileURL(realpathSync(process.argv[1])).href === import.meta.url) {
  try {
    const s3 = await startFakeS3()
    stopOnSignals(() => s3.close())
  }
  catch (error) {
    console.error(error.message)
    process.exit(1)
  }
}
