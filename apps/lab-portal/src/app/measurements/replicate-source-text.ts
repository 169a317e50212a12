import type { Replicate } from '@ohmprint/contracts';

const celsius = (t: number) => `${Number(t.toFixed(2))} °C`;

/** "OP-8MJA-4T (file name, line 3)", the sample as the file writes it, or a dash. */
export function readCode(r: Replicate): string {
  const d = r.declared;
  if (!d) return 'not read (uploaded before files were read)';
  const codes = [...new Set([...d.fileNameCodes, ...(d.sample?.codes ?? [])])];
  if (!codes.length) return d.sample ? `“${d.sample.text}” (line ${d.sample.line}; no sample code)` : '—';
  return codes
    .map((c) => {
      const where = [d.fileNameCodes.includes(c) ? 'file name' : null, d.sample?.codes.includes(c) ? `line ${d.sample.line}` : null].filter(Boolean).join(', ');
      return `${c} (${where})`;
    })
    .join('; ');
}

export interface IdentityLook {
  icon: string;
  text: string;
  tone: 'ok' | 'plain' | 'warn';
}

export function identityLook(r: Replicate): IdentityLook {
  const d = r.declared;
  if (!d) return { icon: 'help', text: 'Not checked', tone: 'plain' };
  if (d.identity === 'matches') return { icon: 'check_circle', text: 'Matches this sample', tone: 'ok' };
  if (d.identity === 'no-code') return { icon: 'remove', text: 'Names no sample code', tone: 'plain' };
  return { icon: 'warning', text: `Names ${d.otherCodes.join(', ')}; kept by the analyst: ${d.identityReason ?? ''}`, tone: 'warn' };
}

/** The temperature used, and where it came from. */
export function readTemperature(r: Replicate): string {
  const stated = r.declared?.temperature;
  switch (r.temperatureSource) {
    case 'file':
      return `${celsius(r.temperatureC)} from the file (line ${stated?.line}${stated && stated.unit !== 'degC' ? `: ${stated.text}` : ''})`;
    case 'entered-over-file':
      return `${celsius(r.temperatureC)} entered; the file states ${stated ? celsius(stated.celsius) : '?'} (line ${stated?.line}). Reason: ${r.declared?.temperatureReason ?? ''}`;
    default:
      return r.declared ? `${celsius(r.temperatureC)} entered; the file states none` : `${celsius(r.temperatureC)} entered`;
  }
}
