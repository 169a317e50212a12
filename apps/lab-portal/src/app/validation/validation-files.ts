import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import { Notifier } from '@ohmprint/ui';

/**
 * Validation downloads (CSV, PDF) go through HttpClient because the token lives in memory, not in a
 * cookie a plain link would carry; the blob is then handed to the browser as a file.
 */
@Injectable({ providedIn: 'root' })
export class ValidationFiles {
  private readonly http = inject(HttpClient);
  private readonly notifier = inject(Notifier);

  download(path: string, fileName: string): void {
    this.http.get(path, { responseType: 'blob' }).subscribe((blob) => {
      const url = URL.createObjectURL(blob);
      const a = document.createElement('a');
      a.href = url;
      a.download = fileName;
      a.click();
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      this.notifier.success(`${fileName} downloaded.`);
    });
  }
}
