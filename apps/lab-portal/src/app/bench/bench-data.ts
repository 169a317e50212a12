import { HttpClient } from '@angular/common/http';
import { Injectable, inject } from '@angular/core';
import {
  BenchEquipmentSchema,
  ControlChartSchema,
  type BenchEquipment,
  type ControlChartView,
  type CreateCell,
  type CreateInstrument,
  type StandardRunFields,
} from '@ohmprint/contracts';
import { quietRequest } from '@ohmprint/ui';
import { map, type Observable } from 'rxjs';

/** Instruments, cells, KCl standard runs and control charts. */
@Injectable({ providedIn: 'root' })
export class BenchData {
  private readonly http = inject(HttpClient);

  equipment(): Observable<BenchEquipment> {
    return this.http.get('/api/lab/bench').pipe(map((r) => BenchEquipmentSchema.parse(r)));
  }

  addInstrument(body: CreateInstrument): Observable<BenchEquipment> {
    return this.http.post('/api/lab/instruments', body, { context: quietRequest() }).pipe(map((r) => BenchEquipmentSchema.parse(r)));
  }

  addCell(body: CreateCell): Observable<BenchEquipment> {
    return this.http.post('/api/lab/cells', body, { context: quietRequest() }).pipe(map((r) => BenchEquipmentSchema.parse(r)));
  }

  chart(cellId: string): Observable<ControlChartView> {
    return this.http.get(`/api/lab/cells/${cellId}/control-chart`).pipe(map((r) => ControlChartSchema.parse(r)));
  }

  recordRun(cellId: string, fields: StandardRunFields, file: File): Observable<ControlChartView> {
    const form = new FormData();
    form.append('concentration', String(fields.concentration));
    form.append('basis', fields.basis);
    form.append('temperatureC', String(fields.temperatureC));
    if (fields.certifiedConductivityAt25UsPerCm !== undefined) form.append('certifiedConductivityAt25UsPerCm', String(fields.certifiedConductivityAt25UsPerCm));
    form.append('file', file, file.name);
    return this.http.post(`/api/lab/cells/${cellId}/standard-runs`, form, { context: quietRequest() }).pipe(map((r) => ControlChartSchema.parse(r)));
  }
}
