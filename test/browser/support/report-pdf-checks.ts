// What anyone holding a report can check with Poppler's own tools: the signature and the printed text.
import { execFileSync } from 'node:child_process';

/** `pdfsig` exits non-zero for an invalid signature, so its output is read whatever the exit code. */
export function pdfSignatureReport(file: string): string {
  try {
    return execFileSync('pdfsig', [file], { encoding: 'utf8' });
  } catch (err) {
    const e = err as { stdout?: string; stderr?: string };
    return `${e.stdout ?? ''}${e.stderr ?? ''}`;
  }
}

/** The report's text with line breaks and runs of spaces folded, so wrapped sentences read whole. */
export function pdfPlainText(file: string): string {
  return execFileSync('pdftotext', ['-layout', file, '-'], { encoding: 'utf8' }).replace(/\s+/g, ' ');
}
