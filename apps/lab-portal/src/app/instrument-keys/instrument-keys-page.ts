import { Clipboard } from '@angular/cdk/clipboard';
import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, signal, viewChild } from '@angular/core';
import { FormControl, FormGroup, FormGroupDirective, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTableModule } from '@angular/material/table';
import type { InstrumentKey, IssuedInstrumentKey } from '@ohmprint/contracts';
import { ApiProblem, EmptyState, Notice, Notifier, confirmAction } from '@ohmprint/ui';
import { filter, switchMap } from 'rxjs';
import { InstrumentKeysData } from './instrument-keys-data';

@Component({
  selector: 'ohm-instrument-keys-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, ReactiveFormsModule, MatButtonModule, MatFormFieldModule, MatIconModule, MatInputModule, MatTableModule, EmptyState, Notice],
  template: `
    <header class="ohm-page-header">
      <div>
        <h1>Instrument keys</h1>
        <p>A key lets a bench computer post measurement files straight to a sample. The full key is shown once, when issued; only its first characters are kept for you to recognise it.</p>
      </div>
    </header>
    <form class="issue" [formGroup]="issueForm" (ngSubmit)="issue()">
      <mat-form-field>
        <mat-label>Name of the bench computer</mat-label>
        <input matInput formControlName="name" placeholder="Bench 2 analyser PC" />
        @if (nameError()) { <mat-error>{{ nameError() }}</mat-error> }
      </mat-form-field>
      <button mat-flat-button type="submit" [disabled]="name.invalid || saving()"><mat-icon>key</mat-icon>Issue a key</button>
    </form>
    @if (issued(); as k) {
      <ohm-notice tone="success" icon="key">
        <p><strong>Key for {{ k.key.name }}.</strong> Copy it now into the bench computer's settings: it will not be shown again.</p>
        <p class="secret"><code>{{ k.secret }}</code>
          <button mat-stroked-button type="button" (click)="copy(k.secret)"><mat-icon>content_copy</mat-icon>Copy</button>
          <button mat-button type="button" (click)="issued.set(null)">I have stored it</button>
        </p>
      </ohm-notice>
    }
    <div class="ohm-table-card">
      <table mat-table [dataSource]="keys()" aria-label="Instrument keys">
        <ng-container matColumnDef="name">
          <th mat-header-cell *matHeaderCellDef>Name</th>
          <td mat-cell *matCellDef="let k">{{ k.name }}</td>
        </ng-container>
        <ng-container matColumnDef="prefix">
          <th mat-header-cell *matHeaderCellDef>Key starts with</th>
          <td mat-cell *matCellDef="let k"><code>{{ k.prefix }}…</code></td>
        </ng-container>
        <ng-container matColumnDef="created">
          <th mat-header-cell *matHeaderCellDef>Issued</th>
          <td mat-cell *matCellDef="let k">{{ k.createdAt | date: 'd MMM y' }} by {{ k.createdBy.displayName }}</td>
        </ng-container>
        <ng-container matColumnDef="lastUsed">
          <th mat-header-cell *matHeaderCellDef>Last used</th>
          <td mat-cell *matCellDef="let k">{{ k.lastUsedAt ? (k.lastUsedAt | date: 'd MMM y, HH:mm') : 'Never' }}</td>
        </ng-container>
        <ng-container matColumnDef="state">
          <th mat-header-cell *matHeaderCellDef>State</th>
          <td mat-cell *matCellDef="let k">
            @if (k.revokedAt) {
              <span class="ohm-status ohm-muted"><mat-icon aria-hidden="true">block</mat-icon>Revoked {{ k.revokedAt | date: 'd MMM y' }}</span>
            } @else {
              <span class="ohm-status"><mat-icon aria-hidden="true">check_circle</mat-icon>Active</span>
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="actions">
          <th mat-header-cell *matHeaderCellDef><span class="cdk-visually-hidden">Actions</span></th>
          <td mat-cell *matCellDef="let k" class="ohm-row-actions">
            @if (!k.revokedAt) {
              <button mat-button type="button" (click)="revoke(k)">Revoke…</button>
            }
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns"></tr>
        <tr mat-row *matRowDef="let row; columns: columns"></tr>
      </table>
      @if (loaded() && keys().length === 0) {
        <ohm-empty-state icon="key_off" heading="No instrument keys yet"><p>Issue one per bench computer, so a lost computer's key can be revoked alone.</p></ohm-empty-state>
      }
    </div>
  `,
  styles: `
    .issue { display: flex; gap: 12px; align-items: baseline; flex-wrap: wrap; }
    .issue mat-form-field { width: min(360px, 100%); }
    .secret { display: flex; flex-wrap: wrap; gap: 8px; align-items: center; }
    code { font-family: ui-monospace, monospace; }
    .secret code { padding: 4px 8px; border-radius: var(--mat-sys-corner-small); background: var(--mat-sys-surface); color: var(--mat-sys-on-surface); user-select: all; }
  `,
})
export class InstrumentKeysPage {
  private readonly data = inject(InstrumentKeysData);
  private readonly notifier = inject(Notifier);
  private readonly dialog = inject(MatDialog);
  private readonly clipboard = inject(Clipboard);
  protected readonly columns = ['name', 'prefix', 'created', 'lastUsed', 'state', 'actions'];
  protected readonly rows = signal<InstrumentKey[]>([]);
  protected readonly loaded = signal(false);
  protected readonly keys = computed(() => [...this.rows()].sort((a, b) => Number(!!a.revokedAt) - Number(!!b.revokedAt)));
  protected readonly issued = signal<IssuedInstrumentKey | null>(null);
  protected readonly saving = signal(false);
  protected readonly nameError = signal<string | null>(null);
  protected readonly name = new FormControl('', { nonNullable: true, validators: [Validators.required, Validators.maxLength(100)] });
  protected readonly issueForm = new FormGroup({ name: this.name });
  /** resetForm also clears the submitted flag, so the emptied field does not show as an error. */
  private readonly formDirective = viewChild.required(FormGroupDirective);

  constructor() {
    this.reload();
  }

  protected issue(): void {
    this.saving.set(true);
    this.data.issue(this.name.value).subscribe({
      next: (k) => {
        this.saving.set(false);
        this.issued.set(k);
        this.formDirective().resetForm();
        this.reload();
      },
      error: (e: unknown) => {
        this.saving.set(false);
        this.nameError.set(ApiProblem.from(e).summary);
      },
    });
  }

  protected copy(secret: string): void {
    if (this.clipboard.copy(secret)) this.notifier.success('Key copied to the clipboard.');
    else this.notifier.error('Copying failed: select the key and copy it by hand.');
  }

  protected revoke(k: InstrumentKey): void {
    confirmAction(this.dialog, {
      title: `Revoke the key for ${k.name}?`,
      message: `Posts with the key starting ${k.prefix} are refused from now on. Measurements it already posted stay.`,
      confirmLabel: 'Revoke key',
      destructive: true,
    })
      .pipe(filter(Boolean), switchMap(() => this.data.revoke(k.id)))
      .subscribe(() => {
        this.notifier.success(`Key for ${k.name} revoked.`);
        this.reload();
      });
  }

  private reload(): void {
    this.data.list().subscribe((keys) => {
      this.rows.set(keys);
      this.loaded.set(true);
    });
  }
}
