import type { Routes } from '@angular/router';
import { InstrumentKeysPage } from './instrument-keys-page';

export default [{ path: '', title: 'Instrument keys · Ohmprint lab', component: InstrumentKeysPage }] satisfies Routes;
