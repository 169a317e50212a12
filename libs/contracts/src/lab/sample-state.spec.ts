import { canMoveSample, SampleCodeSchema } from './sample-state';
import { WorkQueueQuerySchema } from './intake';
import { MeasurementUploadFieldsSchema } from './measurements';

describe('sample codes', () => {
  it('accepts a scanned code typed in lower case with blanks around it', () => {
    expect(SampleCodeSchema.parse('  op-7k3m-q9\n')).toBe('OP-7K3M-Q9');
  });

  it('refuses letters a code never contains (I, L, O, U) so misreads are caught', () => {
    expect(SampleCodeSchema.safeParse('OP-7K3O-Q9').success).toBe(false);
  });
});

describe('sample state machine', () => {
  it('lets a returned or reported sample go back to work, but never straight back to review', () => {
    expect(canMoveSample('returned-for-rework', 'analysed')).toBe(true);
    // a reported sample is re-analysed after its report is revoked (the API checks the revocation)
    expect(canMoveSample('reported', 'analysed')).toBe(true);
    expect(canMoveSample('reported', 'in-review')).toBe(false);
    expect(canMoveSample('awaiting-arrival', 'accepted')).toBe(false);
  });
});

describe('work queue query', () => {
  it('reads several states from one comma-separated value, oldest first by default', () => {
    const q = WorkQueueQuerySchema.parse({ state: 'accepted,measuring' });
    expect(q.state).toEqual(['accepted', 'measuring']);
    expect(q.sort).toBe('age');
    expect(q.dir).toBe('desc');
  });

  it('names the bad state value', () => {
    const r = WorkQueueQuerySchema.safeParse({ state: ['shelved'] });
    expect(r.error?.issues[0]?.path).toEqual(['state', 0]);
  });
});

describe('measurement upload fields', () => {
  const ids = { instrumentId: '3f0c5c9e-8d1b-4b0e-9d3a-2a1f3c4d5e6f', cellId: '6a1e2b3c-4d5e-4f60-8a7b-9c0d1e2f3a4b' };

  it('needs a cell constant when the analyst says they typed one', () => {
    const r = MeasurementUploadFieldsSchema.safeParse({ ...ids, cellConstantSource: 'entered', temperatureC: '20' });
    expect(r.error?.issues[0]?.path).toEqual(['cellConstantPerCm']);
  });

  it('reads multipart strings as numbers', () => {
    const r = MeasurementUploadFieldsSchema.parse({ ...ids, temperatureC: '19.5' });
    expect(r.temperatureC).toBe(19.5);
    expect(r.cellConstantSource).toBe('latest-calibration');
  });
});
