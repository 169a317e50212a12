import { HttpErrorResponse, HttpHeaders } from '@angular/common/http';
import { FormControl, FormGroup, Validators } from '@angular/forms';
import { Subject, of } from 'rxjs';
import { FormSubmission } from './form-submission';

function inviteForm(email: string) {
  return new FormGroup({
    email: new FormControl(email, { nonNullable: true, validators: [Validators.required, Validators.email] }),
    firstAdmin: new FormGroup({ email: new FormControl('admin@example.test', { nonNullable: true }) }),
  });
}

describe('FormSubmission', () => {
  it('sends nothing for an invalid form and marks its fields so their errors show', () => {
    const form = inviteForm('');
    const submission = new FormSubmission(form);
    const request = jest.fn(() => of('sent'));
    submission.submit(request, jest.fn());
    expect(request).not.toHaveBeenCalled();
    expect(form.controls.email.touched).toBe(true);
    expect(submission.saving()).toBe(false);
  });

  it('shows progress while the request runs and hands the answer on', () => {
    const submission = new FormSubmission(inviteForm('ana@example.test'));
    const answer = new Subject<string>();
    const done = jest.fn();
    submission.submit(() => answer, done);
    expect(submission.saving()).toBe(true);
    answer.next('invitation-1');
    expect(done).toHaveBeenCalledWith('invitation-1');
  });

  it('keeps what was typed and puts the refusal on the form and the named field', () => {
    const form = inviteForm('ana@example.test');
    const submission = new FormSubmission(form);
    const answer = new Subject<string>();
    const done = jest.fn();
    submission.submit(() => answer, done);
    answer.error(
      new HttpErrorResponse({
        status: 409,
        headers: new HttpHeaders({ 'content-type': 'application/problem+json' }),
        error: { type: 'about:blank', title: 'Already invited', status: 409, errors: [{ field: 'firstAdmin.email', message: 'already has an account' }] },
      }),
    );
    expect(done).not.toHaveBeenCalled();
    expect(submission.saving()).toBe(false);
    expect(submission.problem()?.summary).toBe('Already invited: check the highlighted fields.');
    expect(form.get('firstAdmin.email')?.getError('server')).toBe('already has an account');
    expect(form.controls.email.value).toBe('ana@example.test');
  });
});
