// Upload checks that need no server: type by content, kept names, Content-Disposition.
import { describe, it, expect } from 'vitest';
import { sniff, sanitizeName, contentDisposition } from '../../server/services/mediaFiles';

describe('media file checks', () => {
  it('knows allowed types by their first bytes, whatever the name', async () => {
    expect((await sniff(Buffer.from('ffd8ffe000104a46494600010100000100010000', 'hex'))).kind).toBe('photo');
    const mp4 = Buffer.alloc(64);
    Buffer.from('000000186674797069736f6d0000020069736f6d69736f32', 'hex').copy(mp4);
    expect(await sniff(mp4)).toMatchObject({ kind: 'video', mime: 'video/mp4', ext: 'mp4' });
    expect((await sniff(Buffer.from('%PDF-1.7\n%\xe2\xe3\n', 'latin1'))).kind).toBe('document');
  });

  it('refuses executables, scripts and SVG with a message naming what Bayslate accepts', async () => {
    await expect(
      sniff(Buffer.concat([Buffer.from([0x7f, 0x45, 0x4c, 0x46, 2, 1, 1]), Buffer.alloc(64)])),
    ).rejects.toMatchObject({ status: 415, message: expect.stringContaining('ELF') });
    await expect(sniff(Buffer.from('MZ' + '\0'.repeat(200)))).rejects.toMatchObject({ status: 415 });
    await expect(sniff(Buffer.from('#!/bin/sh\necho hi\n'))).rejects.toMatchObject({
      message: expect.stringContaining('Bayslate accepts'),
    });
    await expect(
      sniff(Buffer.from('<svg xmlns="http://www.w3.org/2000/svg"><script>1</script></svg>')),
    ).rejects.toMatchObject({ status: 415 });
  });

  it('keeps only a clean base name', () => {
    expect(sanitizeName('../../etc/passwd')).toBe('passwd');
    expect(sanitizeName('C:\\Users\\me\\IMG 01.jpg')).toBe('IMG 01.jpg');
    expect(sanitizeName('..')).toBe('file');
    expect(sanitizeName('a"b<c>\u0007.png')).toBe('a_b_c__.png');
    expect(sanitizeName('.hidden.jpg')).toBe('hidden.jpg');
    expect(sanitizeName(undefined)).toBe('file');
  });

  it('sends the original name in Content-Disposition with an ASCII fallback (RFC 6266 / RFC 5987)', () => {
    expect(contentDisposition('Rechnung – Nr. 7.pdf')).toBe(
      `attachment; filename="Rechnung _ Nr. 7.pdf"; filename*=UTF-8''Rechnung%20%E2%80%93%20Nr.%207.pdf`,
    );
    expect(contentDisposition("it's (1).jpg", 'inline')).toBe(
      `inline; filename="it's (1).jpg"; filename*=UTF-8''it%27s%20%281%29.jpg`,
    );
  });
});
