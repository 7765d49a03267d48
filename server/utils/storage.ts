import { createReadStream } from 'node:fs'
import { stat } from 'node:fs/promises'
import {
  AbortMultipartUploadCommand, CompleteMultipartUploadCommand, CreateMultipartUploadCommand, DeleteObjectCommand,
  GetObjectCommand, HeadObjectCommand, ListPartsCommand, PutObjectCommand, S3Client, UploadPartCommand,
} from '@aws-sdk/client-s3'
import { getSignedUrl } from '@aws-sdk/s3-request-presigner'

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

/** Sends a file from disk without reading it into memory. */
export async function putFile(key: string, file: string, contentType: string) {
  const { client, bucket } = useS3()
  const { size } = await stat(file)
  await client.send(new PutObjectCommand({ Bucket: bucket, Key: key, Body: createReadStream(file), ContentLength: size, ContentType: contentType }))
}

export async function headObject(key: string) {
  const { client, bucket } = useS3()
  return client.send(new HeadObjectCommand({ Bucket: bucket, Key: key }))
}

/** A GET address that works without credentials for `seconds`: for players and for ffmpeg. */
export async function presignedGet(key: string, seconds: number, contentType?: string) {
  const { client, bucket } = useS3()
  return getSignedUrl(client, new GetObjectCommand({ Bucket: bucket, Key: key, ResponseContentType: contentType }), { expiresIn: seconds })
}

// Multipart uploads straight from the browser: the app opens the upload, hands out one presigned
// PUT address per part, and closes it with the parts' ETags; the bytes never pass through the app.

export async function createMultipartUpload(key: string, contentType: string): Promise<string> {
  const { client, bucket } = useS3()
  const answer = await client.send(new CreateMultipartUploadCommand({ Bucket: bucket, Key: key, ContentType: contentType }))
  if (!answer.UploadId) throw new Error('the object store did not open the upload')
  return answer.UploadId
}

export async function presignedPartUrl(key: string, uploadId: string, partNumber: number, seconds: number) {
  const { client, bucket } = useS3()
  return getSignedUrl(client, new UploadPartCommand({ Bucket: bucket, Key: key, UploadId: uploadId, PartNumber: partNumber }), { expiresIn: seconds })
}

/** The parts that arrived, in order; null when the store knows no such upload. */
export async function listUploadedParts(key: string, uploadId: string): Promise<{ partNumber: number, etag: string, size: number }[] | null> {
  const { client, bucket } = useS3()
  const parts: { partNumber: number, etag: string, size: number }[] = []
  let marker: string | undefined
  try {
    for (;;) {
      const page = await client.send(new ListPartsCommand({ Bucket: bucket, Key: key, UploadId: uploadId, PartNumberMarker: marker }))
      for (const p of page.Parts ?? []) {
        if (p.PartNumber !== undefined && p.ETag) parts.push({ partNumber: p.PartNumber, etag: p.ETag.replace(/"/g, ''), size: p.Size ?? 0 })
      }
      if (!page.IsTruncated || !page.NextPartNumberMarker) break
      marker = page.NextPartNumberMarker
    }
  }
  catch (err) {
    if ((err as { name?: string }).name === 'NoSuchUpload') return null
    throw err
  }
  return parts.sort((a, b) => a.partNumber - b.partNumber)
}

export async function completeMultipartUpload(key: string, uploadId: string, parts: readonly { partNumber: number, etag: string }[]) {
  const { client, bucket } = useS3()
  await client.send(new CompleteMultipartUploadCommand({
    Bucket: bucket, Key: key, UploadId: uploadId,
    MultipartUpload: { Parts: parts.map(p => ({ PartNumber: p.partNumber, ETag: `"${p.etag.replace(/"/g, '')}"` })) },
  }))
}

export async function abortMultipartUpload(key: string, uploadId: string) {
  const { client, bucket } = useS3()
  await client.send(new AbortMultipartUploadCommand({ Bucket: bucket, Key: key, UploadId: uploadId })).catch((err) => {
    if ((err as { name?: string }).name !== 'NoSuchUpload') throw err
  })
}
