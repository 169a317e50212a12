import type { Routes } from '@angular/router';
import { TeamPage } from './team-page';

export default [{ path: '', title: 'Team · Ohmprint', component: TeamPage }] satisfies Routes;
