import { ListObjectsV2Command, S3Client } from '@aws-sdk/client-s3';

/**
 * A client of the test's own for the S3 stand-in that `npm test` runs (its S3_* settings), to look at
 * the bucket from outside the app: what was stored, changed or left behind.
 */
export const testBucketClient = new S3Client({
  endpoint: process.env.S3_ENDPOINT,
  region: process.env.S3_REGION,
  credentials: { accessKeyId: process.env.S3_ACCESS_KEY_ID!, secretAccessKey: process.env.S3_SECRET_ACCESS_KEY! },
  forcePathStyle: true,
  // as the app's own client: s3rver mishandles the SDK's default checksum trailers
  requestChecksumCalculation: 'WHEN_REQUIRED',
  responseChecksumValidation: 'WHEN_REQUIRED',
});

/** Every object of the app's bucket (under `prefix`), key to "size etag": a new, changed or lost object shows. */
export async function bucketObjects(prefix?: string): Promise<Map<string, string>> {
  const objects = new Map<string, string>();
  let token: string | undefined;
  do {
    const page = await testBucketClient.send(new ListObjectsV2Command({ Bucket: process.env.S3_BUCKET!, Prefix: prefix, ContinuationToken: token }));
    for (const o of page.Contents ?? []) objects.set(o.Key!, `${o.Size} ${o.ETag}`);
    token = page.IsTruncated ? page.NextContinuationToken : undefined;
  } while (token);
  return objects;
}
