import { createCipheriv, createDecipheriv, randomBytes } from 'node:crypto';

/**
 * AES-256-GCM sealing of credential material at rest: 12-byte nonce, 16-byte tag, then the
 * ciphertext. The tag makes any change to the stored bytes fail to open instead of signing with
 * garbage; the associated data binds a sealed value to its row so values cannot be swapped.
 */
export function seal(plain: Buffer, key: Buffer, associatedData: string): Buffer {
  const nonce = randomBytes(12);
  const cipher = createCipheriv('aes-256-gcm', key, nonce);
  cipher.setAAD(Buffer.from(associatedData, 'utf8'));
  const body = Buffer.concat([cipher.update(plain), cipher.final()]);
  return Buffer.concat([nonce, cipher.getAuthTag(), body]);
}

export function unseal(sealed: Buffer, key: Buffer, associatedData: string): Buffer {
  const decipher = createDecipheriv('aes-256-gcm', key, sealed.subarray(0, 12));
  decipher.setAAD(Buffer.from(associatedData, 'utf8'));
  decipher.setAuthTag(sealed.subarray(12, 28));
  return Buffer.concat([decipher.update(sealed.subarray(28)), decipher.final()]);
}
