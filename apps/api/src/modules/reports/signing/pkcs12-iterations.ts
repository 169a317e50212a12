import forge from 'node-forge';

/**
 * The most key-derivation iterations a PKCS#12 file may ask for. Each iteration is a hash round in
 * pure JavaScript (about 0.3 s per 10000 PBKDF2-SHA256 rounds on an idle core, several times that on
 * a loaded one), and a file may ask for three derivations, so a file asking for millions would hold
 * the API for minutes. Common exports stay below this (OpenSSL 3 writes 2048 by default, Java's
 * keytool 10000, Windows 2000; from memory, so the limit leaves room).
 */
export const MAX_PKCS12_ITERATIONS = 20_000;

const PKCS12_PBE = '1.2.840.113549.1.12.1.'; // pbeWithSHAAnd… (PKCS#12 appendix C)
const PKCS5 = '1.2.840.113549.1.5.'; // PBES1 (pbeWith…AndDES), PBKDF2 (.12), PBES2 (.13)
const PBES2 = '1.2.840.113549.1.5.13';
const MAX_DEPTH = 16;

export interface IterationCount {
  /** What asks for it: the MAC or an encryption scheme. */
  where: string;
  count: bigint;
}

/** A file refused before any key is derived: not a PKCS#12 at all, or too costly to open. */
export class Pkcs12ShapeError extends Error {}

const { Type, Class } = forge.asn1;

function integer(node: forge.asn1.Asn1 | undefined): bigint | null {
  if (!node || node.tagClass !== Class.UNIVERSAL || node.type !== Type.INTEGER || typeof node.value !== 'string') return null;
  const hex = forge.util.bytesToHex(node.value);
  return hex ? BigInt(`0x${hex}`) : 0n;
}

function oidOf(node: forge.asn1.Asn1 | undefined): string | null {
  if (!node || node.tagClass !== Class.UNIVERSAL || node.type !== Type.OID || typeof node.value !== 'string') return null;
  return forge.asn1.derToOid(node.value);
}

const children = (node: forge.asn1.Asn1): forge.asn1.Asn1[] => (Array.isArray(node.value) ? node.value : []);

/** The iteration count in one AlgorithmIdentifier's parameters, when it is a password-based scheme. */
function schemeIterations(oid: string, params: forge.asn1.Asn1 | undefined): bigint | null {
  if (!params) return null;
  if (oid === PBES2) return null; // its PBKDF2 AlgorithmIdentifier inside is visited on its own
  if (oid.startsWith(PKCS12_PBE) || oid.startsWith(PKCS5)) return integer(children(params)[1]);
  return null;
}

function tryDer(bytes: string): forge.asn1.Asn1 | null {
  if (bytes.length < 2) return null;
  try {
    // forge's types know only the old boolean argument; the options object is what it reads
    const fromDer = forge.asn1.fromDer as unknown as (der: string, options: { strict: boolean; parseAllBytes: boolean; decodeBitStrings: boolean }) => forge.asn1.Asn1;
    return fromDer(bytes, { strict: true, parseAllBytes: true, decodeBitStrings: false });
  } catch {
    return null;
  }
}

/** Every iteration count the file shows before decryption: the MAC's and each visible encryption's. */
export function visibleIterationCounts(p12: Buffer): IterationCount[] {
  const root = tryDer(p12.toString('binary'));
  const top = root ? children(root) : [];
  if (!root || root.type !== Type.SEQUENCE || integer(top[0]) === null || top[1]?.type !== Type.SEQUENCE) {
    throw new Pkcs12ShapeError('The file is not a PKCS#12 (.p12/.pfx) file.');
  }
  const found: IterationCount[] = [];
  const mac = top[2] && children(top[2]);
  if (mac) found.push({ where: 'the integrity check (MAC)', count: integer(mac[2]) ?? 1n });

  const visit = (node: forge.asn1.Asn1, depth: number): void => {
    if (depth > MAX_DEPTH) return;
    const kids = children(node);
    const oid = oidOf(kids[0]);
    if (node.type === Type.SEQUENCE && oid) {
      const count = schemeIterations(oid, kids[1]);
      if (count !== null) found.push({ where: `the encryption (${forge.pki.oids[oid] ?? oid})`, count });
    }
    for (const kid of kids) visit(kid, depth + 1);
    // Data content sits in OCTET STRINGs holding DER of their own (authenticated safe, safe contents).
    if (node.type === Type.OCTETSTRING && typeof node.value === 'string' && !node.constructed) {
      const inner = tryDer(node.value);
      if (inner) visit(inner, depth + 1);
    }
  };
  visit(top[1], 0);
  return found;
}

export function iterationLimitMessage(over: IterationCount): string {
  return (
    `The PKCS#12 file asks for ${over.count.toLocaleString('en-GB')} key-derivation iterations in ${over.where}; ` +
    `Ohmprint accepts at most ${MAX_PKCS12_ITERATIONS.toLocaleString('en-GB')}. ` +
    'Export it again with fewer iterations (OpenSSL: -iter 2048 -maciter).'
  );
}

/** Refuses a file whose visible MAC or encryption parameters exceed the limit; nothing is derived. */
export function checkIterations(p12: Buffer): void {
  const over = visibleIterationCounts(p12).find((c) => c.count > BigInt(MAX_PKCS12_ITERATIONS));
  if (over) throw new Pkcs12ShapeError(iterationLimitMessage(over));
}

/**
 * Runs `open` with node-forge's cipher lookup guarded, so an encryption hidden inside an encrypted
 * part (a key bag inside encrypted safe contents) is checked too, just before its key would be
 * derived. `open` is synchronous, so the guard is in place for exactly its duration.
 */
export function withIterationGuard<T>(open: () => T): T {
  const pbe = (forge.pki as unknown as { pbe: { getCipher: (oid: string, params: forge.asn1.Asn1, password: string) => unknown } }).pbe;
  const original = pbe.getCipher;
  pbe.getCipher = (oid, params, password) => {
    let count: bigint | null = null;
    if (oid === PBES2) {
      const kdf = children(children(params)[0] ?? ({} as forge.asn1.Asn1));
      count = integer(children(kdf[1] ?? ({} as forge.asn1.Asn1))[1]);
    } else {
      count = schemeIterations(oid, params);
    }
    if (count !== null && count > BigInt(MAX_PKCS12_ITERATIONS)) {
      throw new Pkcs12ShapeError(iterationLimitMessage({ where: `the encryption (${forge.pki.oids[oid] ?? oid})`, count }));
    }
    return original.call(pbe, oid, params, password);
  };
  try {
    return open();
  } finally {
    pbe.getCipher = original;
  }
}
