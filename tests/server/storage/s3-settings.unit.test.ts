import { describe, expect, it } from 'vitest';
import { readEnv } from '../../../server/config/env';
import { s3SettingsFromEnv } from '../../../server/storage/s3-store';

const fake = { endpoint: 'http://127.0.0.1:54330', credentials: { accessKeyId: 'F', secretAccessKey: 'F' } };

describe('object-store settings from the environment', () => {
  it('uses the shop’s store, keys and addressing when S3_ENDPOINT is set', () => {
    const env = readEnv({
      S3_ENDPOINT: 'https://s3.eu-west-1.amazonaws.com',
      S3_BUCKET: 'tallow-files',
      S3_REGION: 'eu-west-1',
      S3_ACCESS_KEY_ID: 'shop',
      S3_SECRET_ACCESS_KEY: 'secret',
      S3_FORCE_PATH_STYLE: 'false',
    });
    expect(s3SettingsFromEnv(env, fake)).toEqual({
      endpoint: 'https://s3.eu-west-1.amazonaws.com',
      bucket: 'tallow-files',
      region: 'eu-west-1',
      forcePathStyle: false,
      credentials: { accessKeyId: 'shop', secretAccessKey: 'secret' },
    });
    // No keys: the SDK's own chain.
    expect(
      s3SettingsFromEnv(readEnv({ S3_ENDPOINT: 'http://minio.shop.lan:9000' })).credentials,
    ).toBeUndefined();
  });

  it('falls back to the local fake, path-style with its own keys, and says so when there is none', () => {
    expect(
      s3SettingsFromEnv(
        readEnv({ S3_FORCE_PATH_STYLE: 'false', S3_ACCESS_KEY_ID: 'a', S3_SECRET_ACCESS_KEY: 'b' }),
        fake,
      ),
    ).toEqual({
      endpoint: fake.endpoint,
      bucket: 'benchwright',
      region: 'us-east-1',
      forcePathStyle: true,
      credentials: fake.credentials,
    });
    expect(() => s3SettingsFromEnv(readEnv({}))).toThrow('S3_ENDPOINT is not set');
  });
});
