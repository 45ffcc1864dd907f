import { appConfig } from './app.config';
import { validateEnv } from './env.validation';

/* The upload store's settings (docs/service-reports.md, Storage): disk by default, S3_* required for s3. */
describe('env validation: UPLOADS_STORE and S3_*', () => {
  const base = { DB_PASSWORD: 'x', JWT_SECRET: 'j'.repeat(32) };
  const s3 = {
    ...base,
    UPLOADS_STORE: 's3',
    S3_REGION: 'us-east-1',
    S3_BUCKET: 'loamline-uploads',
    S3_ACCESS_KEY_ID: 'key-id',
    S3_SECRET_ACCESS_KEY: 'secret',
  };

  it('the disk is the default and needs no S3 settings', () => {
    expect(validateEnv(base).UPLOADS_STORE).toBe('disk');
    expect(() => validateEnv({ ...base, UPLOADS_STORE: 'ftp' })).toThrow(/UPLOADS_STORE must be one of/);
  });

  it('s3 requires the region, the bucket and the key pair, each named', () => {
    expect(() => validateEnv({ ...base, UPLOADS_STORE: 's3' })).toThrow(
      /S3_REGION: .*S3_BUCKET: .*S3_ACCESS_KEY_ID: .*S3_SECRET_ACCESS_KEY: /,
    );
    expect(validateEnv(s3)).toMatchObject({ S3_FORCE_PATH_STYLE: 'false', S3_CREATE_BUCKET: 'false' });
  });

  it('refuses a bucket name S3 would refuse and an endpoint that is not an http(s) URL', () => {
    // bucket naming rules: 3-63 characters, lower-case letters, digits, dots and hyphens (Amazon S3 User Guide)
    for (const bad of ['ab', 'Uploads', 'under_score', '-dash', 'x'.repeat(64)])
      expect(() => validateEnv({ ...s3, S3_BUCKET: bad })).toThrow(/S3_BUCKET: must be a bucket name/);
    expect(() => validateEnv({ ...s3, S3_ENDPOINT: 'ftp://127.0.0.1:21' })).toThrow(/S3_ENDPOINT/);
    expect(() => validateEnv({ ...s3, S3_FORCE_PATH_STYLE: 'yes' })).toThrow(/S3_FORCE_PATH_STYLE/);
  });

  it('the app config gives the S3 settings only for s3', () => {
    const saved = process.env;
    try {
      process.env = { ...base };
      expect(appConfig()).toMatchObject({ uploadsStore: 'disk', s3: null });
      process.env = {
        ...s3,
        S3_ENDPOINT: 'http://127.0.0.1:4569',
        S3_FORCE_PATH_STYLE: 'true',
        S3_CREATE_BUCKET: 'true',
      };
      expect(appConfig().s3).toEqual({
        endpoint: 'http://127.0.0.1:4569',
        region: 'us-east-1',
        bucket: 'loamline-uploads',
        accessKeyId: 'key-id',
        secretAccessKey: 'secret',
        forcePathStyle: true,
        createBucket: true,
        timeoutMs: 10000,
      });
    } finally {
      process.env = saved;
    }
  });
});
