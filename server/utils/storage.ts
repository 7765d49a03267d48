import { DeleteObjectCommand, GetObjectCommand, PutObjectCommand, S3Client } from '@aws-sdk/client-s3'

let client: S3Client | undefined

/** The object store: the fake in development and tests, any S3-compatible service in production. */
export function useS3(): { client: S3Client, bucket: string } {
  const { s3 } = useRuntimeConfig()
  client ??= new S3Client({
    endpoint: s3.endpoint || undefined,
    region: s3.region,
    forcePathStyle: String(s3.forcePathStyle) === 'true',
    credentials: { accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey },
    // The fake store does not implement the newer default checksums.
    requestChecksumCalculation: 'WHEN_REQUIRED',
    responseChecksumValidation: 'WHEN_REQUIRED',
  })
  return { client, bucket: s3.bucket }
}

export async function putObject(key: string, body: Uint8Array, contentType: string) {
  const { client, bucket } = useS3()
  await client.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: body, ContentType: contentType }))
}

export async function getObject(key: string) {
  const { client, bucket } = useS3()
  return client.send(new GetObjectCommand({ Bucket: bucket, Key: key }))
}

export async function deleteObject(key: string) {
  const { client, bucket } = useS3()
  await client.send(new DeleteObjectCommand({ Bucket: bucket, Key: key }))
}
