import type { EntityManager } from 'typeorm';
import { binomialTestGreater } from '@ohmprint/spectral-engine';
import type { DetectionStudy, Mixture, OngoingPerformance, ValidationFlags } from '@ohmprint/contracts';
import { ApiError } from '../../core/api-error';
import type { AuthContext } from '../auth/auth-context';
import { recordAudit } from '../audit/record-audit';
import { labMethod } from '../libraries/lab-method';

/** Ohmprint's detection rule, printed with the study. */
export const RELIABLE_SHARE = 0.95;
export const MINIMUM_TRIALS = 5;
export const DETECTION_RULE = `A level is reliably detected when at least ${RELIABLE_SHARE * 100} % of at least ${MINIMUM_TRIALS} trials are called not consistent; the lowest reliably detected level is the lowest from which every higher level is reliably detected too.`;
/** Below this one-sided p the rate of "not consistent" on authentic lots is called a drift. */
export const DRIFT_P = 0.05;

type Verdict = 'consistent' | 'inconclusive' | 'not-consistent' | 'no-verdict';

/** The verdict of a sample's newest analysis that is not superseded. */
const LATEST_VERDICT = `(SELECT a.verdict FROM analysis a WHERE a.sample_id = s.id AND a.lab_id = s.lab_id AND a.status <> 'superseded'
  ORDER BY a.created_at DESC, a.id LIMIT 1)`;

export async function setValidationFlags(manager: EntityManager, auth: AuthContext, labId: string, sampleId: string, flags: ValidationFlags): Promise<ValidationFlags> {
  const [row] = await manager.query(`SELECT id, kind, code FROM sample WHERE id = $1 AND lab_id = $2 FOR UPDATE`, [sampleId, labId]);
  if (!row) throw ApiError.notFound('Sample');
  await manager.query(`UPDATE sample SET blind_check = $3, declared_mixture = $4 WHERE id = $1 AND lab_id = $2`, [sampleId, labId, flags.blindCheck, flags.mixture ? JSON.stringify(flags.mixture) : null]);
  await recordAudit(manager, { labId, actorUserId: auth.userId, action: 'sample.validation-flags', subjectType: 'sample', subjectId: sampleId, details: { code: row.code, ...flags } });
  return flags;
}

export async function validationFlags(manager: EntityManager, labId: string, sampleId: string): Promise<ValidationFlags> {
  const [row] = await manager.query(`SELECT blind_check, declared_mixture FROM sample WHERE id = $1 AND lab_id = $2`, [sampleId, labId]);
  if (!row) throw ApiError.notFound('Sample');
  return { blindCheck: row.blind_check, mixture: row.declared_mixture };
}

interface Trial {
  admixture: Mixture['admixture'];
  admixtureName: string;
  levelPercent: number;
  verdict: Verdict;
  synthesised: boolean;
}

export function detectionSeries(trials: Trial[]): DetectionStudy['series'] {
  const groups = new Map<string, Trial[]>();
  for (const t of trials) {
    const key = `${t.admixture}|${t.admixtureName}`;
    groups.set(key, [...(groups.get(key) ?? []), t]);
  }
  return [...groups.values()].map((group) => {
    const levels = [...new Set(group.map((t) => t.levelPercent))].sort((a, b) => a - b).map((levelPercent) => {
      const at = group.filter((t) => t.levelPercent === levelPercent);
      const count = (v: Verdict) => at.filter((t) => t.verdict === v).length;
      const counts = { notConsistent: count('not-consistent'), inconclusive: count('inconclusive'), consistent: count('consistent'), noVerdict: count('no-verdict') };
      const share = counts.notConsistent / at.length;
      return { levelPercent, total: at.length, counts, notConsistentShare: share, reliablyDetected: at.length >= MINIMUM_TRIALS && share >= RELIABLE_SHARE };
    });
    let lowest: number | null = null;
    for (let i = levels.length - 1; i >= 0 && levels[i].reliablyDetected; i--) lowest = levels[i].levelPercent;
    return { admixture: group[0].admixture, admixtureName: group[0].admixtureName, levels, lowestReliableLevelPercent: lowest };
  });
}

/** Per admixture and level, how the product's deliberate mixtures were called. */
export async function detectionStudy(manager: EntityManager, labId: string, productId: string): Promise<DetectionStudy> {
  const [product] = await manager.query(`SELECT id, name FROM product WHERE id = $1 AND lab_id = $2`, [productId, labId]);
  if (!product) throw ApiError.notFound('Product');
  const recorded: { mixture: Mixture; verdict: Verdict }[] = await manager.query(
    `SELECT s.declared_mixture AS mixture, ${LATEST_VERDICT} AS verdict
     FROM sample s JOIN test_order o ON o.id = s.order_id
     WHERE s.lab_id = $1 AND o.product_id = $2 AND s.declared_mixture IS NOT NULL`,
    [labId, productId],
  );
  const synthesised: { admixture: Mixture['admixture']; admixture_name: string; level_percent: number; verdict: Verdict }[] = await manager.query(
    `SELECT admixture, admixture_name, level_percent, verdict FROM synthesised_trial WHERE lab_id = $1 AND product_id = $2 AND kind = 'detection'`,
    [labId, productId],
  );
  const trials: Trial[] = [
    ...recorded.filter((r) => r.verdict).map((r) => ({ ...r.mixture, verdict: r.verdict, synthesised: false })),
    ...synthesised.map((s) => ({ admixture: s.admixture, admixtureName: s.admixture_name, levelPercent: s.level_percent, verdict: s.verdict, synthesised: true })),
  ];
  return { productId, productName: product.name, detectionRule: DETECTION_RULE, series: detectionSeries(trials), synthesisedForDemo: synthesised.length > 0 };
}

/** Whether the observed rate of "not consistent" on authentic blind checks exceeds the promise. */
export function performanceVerdict(total: number, notConsistent: number, promisedRate: number): Pick<OngoingPerformance, 'observedRate' | 'pValue' | 'warning' | 'test'> {
  const test = `One-sided exact binomial test of ${notConsistent} “not consistent” in ${total} blind checks against the promised rate ${(promisedRate * 100).toFixed(1)} %; a warning below p = ${DRIFT_P}.`;
  if (total === 0) return { observedRate: null, pValue: null, warning: null, test };
  const pValue = binomialTestGreater(notConsistent, total, promisedRate);
  const warning = pValue < DRIFT_P
    ? `Authentic lots were called not consistent ${notConsistent} times in ${total} (${((notConsistent / total) * 100).toFixed(1)} %), more than the decision rule allows (${(promisedRate * 100).toFixed(1)} %; p = ${pValue.toPrecision(2)}). Review the libraries, the method and the bench.`
    : null;
  return { observedRate: notConsistent / total, pValue, warning, test };
}

/** Blind re-submissions of authentic lots and how often they were called not consistent. */
export async function ongoingPerformance(manager: EntityManager, labId: string): Promise<OngoingPerformance> {
  const method = await labMethod(manager, labId);
  const promisedRate = 1 - method.upperQuantile;
  const recorded: { at: Date; reference: string; product_name: string; verdict: Verdict | null }[] = await manager.query(
    `SELECT s.state_changed_at AS at, s.code AS reference, p.name AS product_name, ${LATEST_VERDICT} AS verdict
     FROM sample s JOIN test_order o ON o.id = s.order_id JOIN product p ON p.id = o.product_id
     WHERE s.lab_id = $1 AND s.blind_check`,
    [labId],
  );
  const synthesised: { at: Date; reference: string; product_name: string; verdict: Verdict }[] = await manager.query(
    `SELECT t.decided_at AS at, t.reference, p.name AS product_name, t.verdict
     FROM synthesised_trial t JOIN product p ON p.id = t.product_id WHERE t.lab_id = $1 AND t.kind = 'blind-check'`,
    [labId],
  );
  const checks = [
    ...recorded.filter((r) => r.verdict && r.verdict !== 'no-verdict').map((r) => ({ ...r, verdict: r.verdict as Verdict, synthesisedForDemo: false })),
    ...synthesised.filter((s) => s.verdict !== 'no-verdict').map((s) => ({ ...s, synthesisedForDemo: true })),
  ].sort((a, b) => b.at.getTime() - a.at.getTime() || a.reference.localeCompare(b.reference));
  const notConsistent = checks.filter((c) => c.verdict === 'not-consistent').length;
  return {
    total: checks.length,
    notConsistent,
    promisedRate,
    ...performanceVerdict(checks.length, notConsistent, promisedRate),
    checks: checks.map((c) => ({ at: c.at.toISOString(), reference: c.reference, productName: c.product_name, verdict: c.verdict, synthesisedForDemo: c.synthesisedForDemo })),
  };
}
