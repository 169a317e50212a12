import { DatePipe, DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject, input, signal, effect } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatPaginatorModule } from '@angular/material/paginator';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import { MATRIX_LABELS, publicationProgressText, THRESHOLD_ESTIMATOR_LABELS, type CrossProductCheck, type LibraryLot, type LibraryOverview, type LibraryPublication, type LibraryVersionDetail } from '@ohmprint/contracts';
import { ApiProblem, BodeChart, DistanceHistogram, LibraryMap, Notice, Notifier, ServerList, Session, oneOfOr, type DistanceHistogramInput, type MapPoint, type ReferenceBand, type SpectrumSeries } from '@ohmprint/ui';
import { switchMap, takeWhile, timer, type Subscription } from 'rxjs';
import { LibrariesData } from './libraries-data';

const LOT_FILTERS = ['all', 'included', 'excluded'] as const;
type LotFilter = (typeof LOT_FILTERS)[number];
type LotSort = 'distance' | 'lotCode' | 'producedOn';

/**
 * One library version: where its thresholds stand and how sure they are, every lot's quality and
 * leave-one-out distance (paged on the server), the band and the map (summaries, not hundreds of
 * lines), what changed against the previous version, and how well the method tells the producer's
 * products apart. Drafts are built here; reviewers and lab admins publish or retire.
 */
@Component({
  selector: 'ohm-library-version-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, DecimalPipe, PercentPipe, FormsModule, RouterLink, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatPaginatorModule, MatSelectModule, BodeChart, LibraryMap, DistanceHistogram, MatProgressBarModule, Notice],
  styles: `
    section { margin-bottom: 1.75rem; }
    .facts { display: grid; grid-template-columns: repeat(auto-fill, minmax(14rem, 1fr)); gap: .5rem 1.5rem; margin: 0; }
    .facts div { display: flex; flex-direction: column; }
    .facts dt { font: var(--mat-sys-label-medium); color: var(--mat-sys-on-surface-variant); }
    .facts dd { margin: 0; font: var(--mat-sys-body-large); }
    .blockers { border-left: 4px solid var(--mat-sys-error); padding: .5rem 1rem; background: var(--mat-sys-error-container); color: var(--mat-sys-on-error-container); }
    .actions { display: flex; gap: .5rem; align-items: center; flex-wrap: wrap; }
    .actions mat-form-field { width: 22rem; }
    .charts { display: grid; grid-template-columns: repeat(auto-fit, minmax(22rem, 1fr)); gap: 1rem; }
    table { border-collapse: collapse; width: 100%; }
    th, td { text-align: left; padding: .35rem .5rem; border-bottom: 1px solid var(--mat-sys-outline-variant); }
    td.num, th.num { text-align: right; font-variant-numeric: tabular-nums; }
    tr.outlier td { font-weight: 600; }
    .publishing { margin: 1rem 0; max-width: 48rem; }
    .flag { display: inline-flex; align-items: center; gap: .25rem; }
    .flag mat-icon { font-size: 18px; width: 18px; height: 18px; }
  `,
  template: `
    @if (version(); as v) {
      <header class="ohm-page-header">
        <div>
          <p><a routerLink="/libraries">Reference libraries</a></p>
          <h1>{{ v.product.name }} · library version {{ v.version }}</h1>
          <p>{{ v.clientOrganisation.name }} · {{ matrixLabel[v.product.matrix] }} ·
            <span class="flag"><mat-icon aria-hidden="true">{{ v.status === 'published' ? 'verified' : v.status === 'retired' ? 'archive' : 'edit_note' }}</mat-icon>
            {{ v.status === 'published' && v.supersededBy ? 'published, superseded by version ' + v.supersededBy : v.status }}</span>
            @if (v.methodVersion) { · built under {{ v.methodVersion.name }} v{{ v.methodVersion.version }} }</p>
        </div>
      </header>

      @if (v.status === 'retired') {
        <p class="blockers" role="status">Retired {{ v.retiredAt | date: 'd MMM y' }} by {{ v.retiredBy?.displayName }}: {{ v.retirementReason }}. Analyses that used it stay reproducible; new analyses use a current version.</p>
      }

      <section aria-labelledby="thresholds-heading">
        <h2 id="thresholds-heading">Thresholds and how sure they are</h2>
        @if (v.calibration; as c) {
          <dl class="facts">
            <div><dt>Estimator</dt><dd>{{ estimatorLabel(c.estimator) }}</dd></div>
            <div><dt>Lots (n)</dt><dd>{{ c.lotCount }}</dd></div>
            <div><dt>T95</dt><dd>{{ c.t95 | number: '1.4-4' }} @if (c.t95Interval) { <small>({{ interval(c.t95Interval) }})</small> }</dd></div>
            <div><dt>T99</dt><dd>{{ c.t99 | number: '1.4-4' }} @if (c.t99Interval) { <small>({{ interval(c.t99Interval) }})</small> }</dd></div>
            @if (c.bootstrap) { <div><dt>Intervals</dt><dd>{{ c.bootstrap.confidenceLevel | percent }} percentile bootstrap, {{ c.bootstrap.resamples }} resamples, seed {{ c.bootstrap.seed }}</dd></div> }
            @if (v.method.maxThresholdIntervalWidth) { <div><dt>Publish limit</dt><dd>interval at most {{ v.method.maxThresholdIntervalWidth | percent }} of its threshold</dd></div> }
          </dl>
        } @else {
          <p>Not calibrated yet{{ v.status === 'draft' ? ': calibrate the draft to see its thresholds.' : '.' }}</p>
        }
        @if (v.publishBlockers.length) {
          <div class="blockers" role="status"><p><strong>Not publishable yet:</strong></p><ul>@for (b of v.publishBlockers; track b.code + b.message) { <li>{{ b.message }}</li> }</ul></div>
        }
      </section>

      <section aria-labelledby="actions-heading" class="actions">
        <h2 id="actions-heading" class="cdk-visually-hidden">Actions</h2>
        @if (v.status === 'draft') {
          @if (isAnalyst()) { <button mat-stroked-button type="button" (click)="act('calibrate')"><mat-icon>calculate</mat-icon>Calibrate</button> }
          @if (canPublish()) { <button mat-flat-button type="button" [disabled]="v.publishBlockers.length > 0 || publishing()" (click)="publish()"><mat-icon>verified</mat-icon>Publish version {{ v.version }}</button> }
          @if (isAnalyst()) { <button mat-button type="button" (click)="discard()"><mat-icon>delete</mat-icon>Discard draft</button> }
        }
        @if (v.status === 'published' && canPublish()) {
          <mat-form-field subscriptSizing="dynamic"><mat-label>Why retire it</mat-label><input matInput [(ngModel)]="retireReason" /></mat-form-field>
          <button mat-stroked-button type="button" [disabled]="retireReason.trim().length < 3" (click)="act('retire', { reason: retireReason })"><mat-icon>archive</mat-icon>Retire</button>
        }
      </section>

      @if (publication(); as p) {
        @if (p.state === 'queued' || p.state === 'running') {
          <section class="publishing" role="status" aria-live="polite">
            @let said = progressText(p);
            <p><strong>{{ said.headline }}</strong>
              Version {{ p.version }} is being published by a worker: every lot is compared with every other and the thresholds are set. You may leave this page; it carries on.</p>
            @if (said.percent !== null) {
              <mat-progress-bar mode="determinate" [value]="said.percent" [attr.aria-label]="'Publishing version ' + p.version + ': lots compared'" />
            } @else {
              <mat-progress-bar mode="indeterminate" [attr.aria-label]="'Publishing version ' + p.version" />
            }
          </section>
        } @else if (p.state === 'failed') {
          <ohm-notice tone="error" icon="error">Version {{ p.version }} was not published. {{ p.detail }}</ohm-notice>
        }
      }

      @if (v.changes; as ch) {
        <section aria-labelledby="changes-heading">
          <h2 id="changes-heading">What changed since version {{ ch.previousVersion }}</h2>
          <ul>
            <li>{{ ch.lotsAdded.length }} lot(s) added{{ ch.lotsAdded.length ? ': ' + few(ch.lotsAdded) : '' }}; {{ ch.lotsRemoved.length }} removed{{ ch.lotsRemoved.length ? ': ' + few(ch.lotsRemoved) : '' }}.</li>
            <li>T95 {{ ch.t95.before | number: '1.4-4' }} → {{ ch.t95.after | number: '1.4-4' }}; T99 {{ ch.t99.before | number: '1.4-4' }} → {{ ch.t99.after | number: '1.4-4' }}.</li>
            @for (d of ch.methodDifferences; track d.field) { <li>{{ d.label }}: {{ d.before ?? '—' }} → {{ d.after ?? '—' }}</li> } @empty { <li>Method settings unchanged.</li> }
          </ul>
        </section>
      }

      <section aria-labelledby="spread-heading">
        <h2 id="spread-heading">The lots and their spread</h2>
        <div class="charts">
          @if (overview(); as o) {
            <ohm-bode-chart [series]="standouts()" [band]="band()" [unit]="o.impedanceUnit" heading="Included lots: band (range) with the lots that stand out" />
            <ohm-library-map [points]="mapPoints()" heading="Map of the included lots (classical MDS)" />
          }
          @if (histogram(); as h) { <ohm-distance-histogram [data]="h" heading="Leave-one-out distances with T95 and T99" /> }
        </div>
        @if (overview()?.mapLotsLeftOut) { <p>The map shows the {{ overview()!.map.length }} lots farthest from the rest; {{ overview()!.mapLotsLeftOut }} more are in the table.</p> }
      </section>

      <section aria-labelledby="lots-heading">
        <h2 id="lots-heading">Lots ({{ v.includedLotCount }} included, {{ v.excludedLotCount }} excluded)</h2>
        <div class="actions">
          <mat-form-field subscriptSizing="dynamic"><mat-label>Show</mat-label>
            <mat-select [value]="list.filters().included" (selectionChange)="list.filter({ included: $event.value })">
              <mat-option value="all">All lots</mat-option><mat-option value="included">Included</mat-option><mat-option value="excluded">Excluded</mat-option>
            </mat-select>
          </mat-form-field>
          <mat-form-field subscriptSizing="dynamic"><mat-label>Sort by</mat-label>
            <mat-select [value]="list.state().sort" (selectionChange)="setSort($event.value)">
              <mat-option value="distance">Leave-one-out distance, largest first</mat-option><mat-option value="lotCode">Lot code</mat-option><mat-option value="producedOn">Production date</mat-option>
            </mat-select>
          </mat-form-field>
          @if (v.status === 'draft' && isAnalyst()) {
            <mat-form-field subscriptSizing="dynamic"><mat-label>Reason for including or excluding</mat-label><input matInput [(ngModel)]="lotReason" /></mat-form-field>
          }
        </div>
        <table aria-label="Lots of this version">
          <thead><tr><th scope="col">Lot</th><th scope="col">Sample</th><th scope="col">Produced</th><th scope="col">Quality</th><th scope="col" class="num">Leave-one-out distance</th><th scope="col">Nearest lot</th><th scope="col" class="num">Typicality</th><th scope="col">Status</th>
            @if (v.status === 'draft' && isAnalyst()) { <th scope="col"><span class="cdk-visually-hidden">Change</span></th> }</tr></thead>
          <tbody>
            @for (l of list.rows(); track l.id) {
              <tr [class.outlier]="l.outlier">
                <td>{{ l.lotCode }}</td><td>{{ l.sampleCode ?? '—' }}</td><td>{{ l.producedOn ?? '—' }}</td>
                <td>{{ quality(l) }}</td>
                <td class="num">{{ l.looDistance === null ? '—' : (l.looDistance | number: '1.5-5') }}</td>
                <td>{{ l.nearestLotCode ?? '—' }}</td>
                <td class="num">{{ l.typicality === null ? '—' : (l.typicality | percent) }}</td>
                <td>
                  @if (!l.included) { <span class="flag"><mat-icon aria-hidden="true">block</mat-icon>Excluded: {{ l.exclusionReason }}</span> }
                  @else if (l.outlier) { <span class="flag"><mat-icon aria-hidden="true">warning</mat-icon>Beyond T99</span> }
                  @else { <span class="flag"><mat-icon aria-hidden="true">check</mat-icon>Included</span> }
                </td>
                @if (v.status === 'draft' && isAnalyst()) {
                  <td><button mat-button type="button" [disabled]="lotReason.trim().length < 3" (click)="toggle(l)">{{ l.included ? 'Exclude' : 'Include' }}</button></td>
                }
              </tr>
            }
          </tbody>
        </table>
        <mat-paginator [length]="list.total()" [pageSize]="list.state().pageSize" [pageIndex]="list.state().page - 1" [pageSizeOptions]="list.pageSizes" (page)="list.turn($event)" aria-label="Pages of lots" />
      </section>

      @if (cross(); as x) {
        <section aria-labelledby="cross-heading">
          <h2 id="cross-heading">Telling the producer’s {{ matrixLabel[x.matrix].toLowerCase() }} products apart</h2>
          @if (x.products.length < 2) {
            <p>{{ v.clientOrganisation.name }} has no other {{ matrixLabel[x.matrix].toLowerCase() }} product with a library on this grid to compare with.</p>
          } @else {
            <p>Each lot’s nearest other lot among all these products: {{ x.agreement | percent: '1.0-1' }} of lots are nearest to a lot of their own product.</p>
            <table aria-label="Confusion table: product of each lot against the product of its nearest other lot">
              <thead><tr><th scope="col">Lots of ↓ / nearest lot of →</th>@for (p of x.products; track p.id) { <th scope="col" class="num">{{ p.name }}</th> }</tr></thead>
              <tbody>@for (p of x.products; track p.id; let i = $index) { <tr><th scope="row">{{ p.name }} (v{{ p.version }}, {{ p.lotCount }} lots)</th>@for (n of x.confusion[i]; track $index) { <td class="num">{{ n }}</td> }</tr> }</tbody>
            </table>
            @if (x.confused.length) { <p>Lots nearest to another product: @for (c of x.confused.slice(0, 10); track c.lotCode) { {{ c.lotCode }} → {{ c.nearestProduct }} ({{ c.nearestLotCode }}); }</p> }
          }
          @for (n of x.notCompared; track n.name) { <p>{{ n.name }} not compared: {{ n.reason }}.</p> }
        </section>
      }
    }
  `,
})
export class LibraryVersionPage {
  protected readonly matrixLabel = MATRIX_LABELS;
  private readonly data = inject(LibrariesData);
  private readonly notifier = inject(Notifier);
  private readonly session = inject(Session);
  readonly id = input.required<string>();
  protected readonly version = signal<LibraryVersionDetail | null>(null);
  protected readonly overview = signal<LibraryOverview | null>(null);
  protected readonly cross = signal<CrossProductCheck | null>(null);
  /** The lot table's sort, filter and page live in the URL, as every list's do. */
  protected readonly list = new ServerList<LibraryLot, { included: LotFilter }>({
    sorts: ['distance', 'lotCode', 'producedOn'],
    sort: 'distance',
    dir: 'desc',
    pageSizes: [10, 25, 50, 100],
    pageSize: 25,
    filters: { included: oneOfOr(LOT_FILTERS, 'all') },
    scope: () => this.id(),
    fetch: (query, f) =>
      this.data.lots(this.id(), { page: query.page, pageSize: query.pageSize, sort: query.sort as LotSort, dir: query.sort === 'distance' ? 'desc' : 'asc', included: f.included }),
  });
  protected readonly isAnalyst = computed(() => this.session.hasAnyRole(['analyst']));
  protected readonly canPublish = computed(() => this.session.hasAnyRole(['lab-admin', 'reviewer']));
  /** A large draft's publication by a worker, polled every second while queued or running. */
  protected readonly publication = signal<LibraryPublication | null>(null);
  protected readonly progressText = publicationProgressText;
  protected readonly publishing = computed(() => ['queued', 'running'].includes(this.publication()?.state ?? ''));
  private polling: Subscription | null = null;
  protected retireReason = '';
  protected lotReason = '';

  protected readonly band = computed((): ReferenceBand | null => {
    const o = this.overview();
    if (!o?.band) return null;
    return { label: 'Included lots (range)', frequencyHz: o.frequencyHz, ...o.band };
  });
  protected readonly standouts = computed((): SpectrumSeries[] => {
    const o = this.overview();
    if (!o?.band) return [];
    return [
      { label: 'Median of the lots', frequencyHz: o.frequencyHz, re: o.band.reMedian, im: o.band.imMedian },
      ...o.standouts.map((s) => ({ label: `${s.lotCode} (stands out)`, frequencyHz: o.frequencyHz, re: s.re, im: s.im })),
    ];
  });
  protected readonly mapPoints = computed((): MapPoint[] => (this.overview()?.map ?? []).map((p) => ({ id: p.lotId, label: p.lotCode, x: p.x, y: p.y, kind: 'reference' })));
  protected readonly histogram = computed((): DistanceHistogramInput | null => {
    const c = this.version()?.calibration;
    return c ? { calibrationDistances: c.distances, t95: c.t95, t99: c.t99, sampleDistance: null } : null;
  });

  constructor() {
    effect(() => this.reload(this.id()));
    inject(DestroyRef).onDestroy(() => this.polling?.unsubscribe());
  }

  private reload(id: string): void {
    this.polling?.unsubscribe();
    this.publication.set(null);
    this.data.version(id).subscribe((v) => {
      this.version.set(v);
      // A draft may be waiting for, or have failed, its publication by a worker.
      if (v.status === 'draft') this.follow(id, false);
    });
    this.data.overview(id).subscribe((o) => this.overview.set(o));
    this.data.crossProduct(id).subscribe((x) => this.cross.set(x));
  }

  protected estimatorLabel(e: keyof typeof THRESHOLD_ESTIMATOR_LABELS): string {
    return THRESHOLD_ESTIMATOR_LABELS[e];
  }

  protected interval(i: readonly [number, number]): string {
    return `${i[0].toFixed(4)} to ${i[1].toFixed(4)}`;
  }

  protected few(codes: string[]): string {
    return codes.length > 6 ? `${codes.slice(0, 6).join(', ')} and ${codes.length - 6} more` : codes.join(', ');
  }

  protected quality(l: LibraryLot): string {
    const q = l.quality;
    if (q.problems.length) return q.problems.join('; ');
    const kk = q.kkMaxResidualPercent === null ? '' : `, KK ≤ ${q.kkMaxResidualPercent.toFixed(2)} %`;
    const agree = q.replicateMaxDistance === null ? '' : `, replicates within ${q.replicateMaxDistance.toPrecision(2)}`;
    return `${q.replicates} replicate(s)${kk}${agree}`;
  }

  protected setSort(sort: LotSort): void {
    this.list.sortBy({ active: sort, direction: sort === 'distance' ? 'desc' : 'asc' });
  }

  protected toggle(l: LibraryLot): void {
    this.data.setInclusion(this.id(), l.id, !l.included, this.lotReason.trim()).subscribe((v) => {
      this.version.set(v);
      this.notifier.success(`${l.lotCode} ${l.included ? 'excluded' : 'included'}; the draft was recalibrated.`);
      this.data.overview(this.id()).subscribe((o) => this.overview.set(o));
      this.data.crossProduct(this.id()).subscribe((x) => this.cross.set(x));
      this.list.reload();
    });
  }

  protected act(action: 'calibrate' | 'publish' | 'retire', body: object = {}): void {
    this.data.act(this.id(), action, body).subscribe((v) => {
      this.version.set(v);
      this.notifier.success(action === 'publish' ? `Version ${v.version} is published and frozen.` : action === 'retire' ? `Version ${v.version} is retired.` : 'Calibrated.');
      this.list.reload();
    });
  }

  protected publish(): void {
    this.data.publish(this.id()).subscribe((r) => {
      if ('detail' in r) {
        this.version.set(r.detail);
        this.notifier.success(`Version ${r.detail.version} is published and frozen.`);
        this.list.reload();
        return;
      }
      this.publication.set(r.publication);
      this.follow(this.id(), true);
    });
  }

  /** Polls a draft's publication every second while it is queued or running; published, reloads the version. */
  private follow(id: string, announce: boolean): void {
    this.polling?.unsubscribe();
    this.polling = timer(0, 1000)
      .pipe(
        switchMap(() => this.data.publication(id)),
        takeWhile((p) => p.state === 'queued' || p.state === 'running', true),
      )
      .subscribe({
        next: (p) => {
          this.publication.set(p.state === 'draft' ? null : p);
          if (p.state === 'published') {
            this.publication.set(null);
            this.reload(id);
            if (announce) this.notifier.success(`Version ${p.version} is published and frozen.`);
          }
        },
        error: (e: unknown) => this.notifier.problem(ApiProblem.from(e)),
      });
  }

  protected discard(): void {
    const v = this.version();
    this.data.discard(this.id()).subscribe(() => {
      this.notifier.success(`Draft version ${v?.version} discarded.`);
      this.version.set(null);
    });
  }
}
