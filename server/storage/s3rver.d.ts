// s3rver ships no types: the part of its API the local object-store fake uses (a Koa app).
declare module 's3rver' {
  export default class S3rver {
    constructor(options: { directory: string; silent?: boolean; configureBuckets?: { name: string }[] });
    configureBuckets(): Promise<void>;
    callback(): import('node:http').RequestListener;
  }
}
