import { cleanFileName, inlineDisposition } from './file-names';

describe('cleanFileName', () => {
  it('keeps only the last part of a path, with either separator', () => {
    expect(cleanFileName('../../x.jpg', 'photo')).toBe('x.jpg');
    expect(cleanFileName('C:\\x\\y.jpg', 'photo')).toBe('y.jpg');
    expect(cleanFileName('/etc/passwd', 'photo')).toBe('passwd');
  });

  it('removes control and text-direction characters, leading dots; falls back when nothing is left', () => {
    expect(cleanFileName('fo\u0000rk\n\u202Egpj.png', 'photo')).toBe('forkgpj.png');
    expect(cleanFileName('.hidden.jpg', 'photo')).toBe('hidden.jpg');
    expect(cleanFileName('../', 'photo')).toBe('photo');
    expect(cleanFileName(undefined, 'curve.csv')).toBe('curve.csv');
  });

  it('keeps at most 200 characters, the extension kept', () => {
    const n = cleanFileName(`${'a'.repeat(300)}.jpeg`, 'photo');
    expect(n).toHaveLength(200);
    expect(n.endsWith('.jpeg')).toBe(true);
  });

  it('puts a non-ASCII name in filename* and never a quote in filename', () => {
    expect(inlineDisposition('fork.jpg')).toBe('inline; filename="fork.jpg"');
    expect(inlineDisposition('gabel "vorn" ü.jpg')).toBe(
      `inline; filename="gabel _vorn_ _.jpg"; filename*=UTF-8''gabel%20%22vorn%22%20%C3%BC.jpg`,
    );
  });
});
