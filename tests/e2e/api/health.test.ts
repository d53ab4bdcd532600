import { ApiClient } from '@/tests/e2e/support/http';

describe('GET /api/health', () => {
  it('answers without a session that the app and database are up', async () => {
    const res = await new ApiClient().get('/api/health');
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/application\/json/);
    expect(res.json).toEqual({ ok: true, db: 'up' });
  });

  it('is not cached between calls', async () => {
    const client = new ApiClient();
    const [a, b] = await Promise.all([client.get('/api/health'), client.get('/api/health')]);
    expect(a.status).toBe(200);
    expect(b.status).toBe(200);
    expect(a.headers.get('x-nextjs-cache')).not.toBe('HIT');
    expect(b.headers.get('x-nextjs-cache')).not.toBe('HIT');
  });
});
