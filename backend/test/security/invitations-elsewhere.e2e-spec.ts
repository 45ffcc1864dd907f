import type { INestApplication } from '@nestjs/common';
import request from 'supertest';
import { createShop, createUser, uniqueEmail, type TestUser } from '../factories/accounts';
import { tokenFromLink, waitForMail } from '../utils/mail-inbox';
import { createTestApp } from '../utils/test-app';

/**
 * Finding 12: an open invitation from another shop stayed listed (and usable until the 409) after
 * the address joined elsewhere. Joining ends every other open invitation to the address, and a
 * shop's list leaves out addresses that have an account by now.
 */
describe('security 12: invitations to an address that joined elsewhere', () => {
  let app: INestApplication;
  let http: ReturnType<INestApplication['getHttpServer']>;
  let ownerA: TestUser;
  let ownerB: TestUser;

  beforeAll(async () => {
    app = await createTestApp();
    http = app.getHttpServer();
    ownerA = await createUser(app, { role: 'owner', shopId: (await createShop(app)).id });
    ownerB = await createUser(app, { role: 'owner', shopId: (await createShop(app)).id });
  });
  afterAll(async () => {
    await app.close();
  });

  const invite = (owner: TestUser, email: string) =>
    request(http)
      .post('/api/workshop/team/invitations')
      .set('Cookie', owner.cookie)
      .send({ email, role: 'technician' })
      .expect(201);
  const listed = async (owner: TestUser): Promise<string[]> => {
    const res = await request(http).get('/api/workshop/team').set('Cookie', owner.cookie).expect(200);
    return (res.body as { invitations: { email: string }[] }).invitations.map((i) => i.email);
  };

  it("joining shop A takes shop B's invitation off B's list and ends its link", async () => {
    const email = uniqueEmail('both');
    await invite(ownerA, email);
    await invite(ownerB, email);
    const [first, second] = (await waitForMail(email, 2)).map((m) => tokenFromLink(m, '/join').token);
    expect(await listed(ownerA)).toContain(email);
    expect(await listed(ownerB)).toContain(email);

    await request(http)
      .post('/api/invitations/accept')
      .send({ token: first, name: 'Joined Once', password: 'a-long-enough-secret' })
      .expect(201);
    // one shop has the address as staff now; neither lists an invitation to it, the other link ends
    expect(await listed(ownerA)).not.toContain(email);
    expect(await listed(ownerB)).not.toContain(email);
    await request(http).get(`/api/invitations/${second}`).expect(404);
    await request(http)
      .post('/api/invitations/accept')
      .send({ token: second, name: 'Joined Twice', password: 'a-long-enough-secret' })
      .expect(404);
  });

  it('an address that registered as a rider is not listed any more either', async () => {
    const email = uniqueEmail('rider-later');
    await invite(ownerA, email);
    expect(await listed(ownerA)).toContain(email);
    await request(http)
      .post('/api/auth/register')
      .send({ email, password: 'a-long-enough-secret', name: 'Rider Later' })
      .expect(201);
    expect(await listed(ownerA)).not.toContain(email);
  });
});
