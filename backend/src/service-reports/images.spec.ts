import sharp from 'sharp';
import { checkPhoto } from './images';

/*
 * A photo from a phone carries EXIF metadata (camera, time and often the GPS position, which is
 * where the rider keeps the bike). The stored picture is re-encoded without it. EXIF tags as in
 * the EXIF 2.32 standard (CIPA DC-008); sharp reads them back as `exif`.
 */
describe('checkPhoto', () => {
  it('stores the picture without its metadata, upright, in its own format', async () => {
    const withExif = await sharp({ create: { width: 64, height: 48, channels: 3, background: '#5a7a4a' } })
      .jpeg()
      .withExif({ IFD0: { Copyright: 'a test camera owner', Make: 'TestCam' } })
      .toBuffer();
    expect((await sharp(withExif).metadata()).exif).toBeDefined();
    const checked = await checkPhoto(withExif);
    expect(checked.contentType).toBe('image/jpeg');
    const stored = await sharp(checked.clean).metadata();
    expect(stored.exif).toBeUndefined();
    expect(stored.format).toBe('jpeg');
    expect([stored.width, stored.height]).toEqual([64, 48]);
    const thumb = await sharp(checked.thumbnail).metadata();
    expect(thumb.exif).toBeUndefined();
  });

  it('keeps a PNG a PNG', async () => {
    const png = await sharp({ create: { width: 10, height: 10, channels: 4, background: '#ffffff' } })
      .png()
      .toBuffer();
    expect((await sharp((await checkPhoto(png)).clean).metadata()).format).toBe('png');
  });
});
