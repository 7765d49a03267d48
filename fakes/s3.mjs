// A local S3: s3rver on 127.0.0.1 with one bucket, kept on disk in FAKE_S3_DIR.
import { mkdirSync, realpathSync } from 'node:fs'
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
