import type { OpenAPIObject } from '@nestjs/swagger';
import { withServiceUnavailable } from './service-unavailable';

function doc(): OpenAPIObject {
  return {
    openapi: '3.0.0',
    info: { title: 't', version: '1' },
    paths: {
      '/api/a': {
        get: { responses: { '200': { description: 'ok' } } },
        post: { responses: { '201': { description: 'made' } } },
      },
      '/api/pay': {
        post: { responses: { '503': { description: 'The payment service is away.' } } },
      },
    },
  };
}

describe('withServiceUnavailable', () => {
  it('adds the shared 503 with Retry-After (RFC 9110 §10.2.3) to every operation', () => {
    const out = withServiceUnavailable(doc());
    expect(out.paths['/api/a'].get!.responses['503']).toEqual({
      $ref: '#/components/responses/ServiceUnavailable',
    });
    expect(out.paths['/api/a'].post!.responses['503']).toBeDefined();
    const shared = out.components!.responses!.ServiceUnavailable as { headers: Record<string, unknown> };
    expect(shared.headers['Retry-After']).toBeDefined();
  });

  it("keeps an operation's own 503", () => {
    const out = withServiceUnavailable(doc());
    expect(out.paths['/api/pay'].post!.responses['503']).toEqual({
      description: 'The payment service is away.',
    });
  });
});
