import { statesForRoles } from './role-states';

describe('statesForRoles', () => {
  it('opens an intake technician on arrivals still to receive or decide', () => {
    expect(statesForRoles(['intake-technician'])).toEqual(['awaiting-arrival', 'received']);
  });

  it('joins the states of every role a person holds, without repeats', () => {
    expect(statesForRoles(['analyst', 'reviewer', 'analyst'])).toEqual(['accepted', 'measuring', 'analysed', 'returned-for-rework', 'in-review']);
  });

  it('shows everything to a lab admin with no bench role', () => {
    expect(statesForRoles(['lab-admin'])).toEqual([]);
  });
});
