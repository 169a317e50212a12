import { TestBed } from '@angular/core/testing';
import { ParameterSymbol, Quantity } from './quantity';

describe('Quantity', () => {
  function render(value: number, se: number | null, unit = '') {
    const fixture = TestBed.createComponent(Quantity);
    fixture.componentRef.setInput('value', value);
    fixture.componentRef.setInput('standardError', se);
    fixture.componentRef.setInput('unit', unit);
    fixture.detectChanges();
    return fixture.nativeElement as HTMLElement;
  }

  it('shows the power of ten as a real superscript with the value and SE sharing the last decimal place', () => {
    // the same figures the report PDF prints (libs/contracts/src/format, checked against Python decimal)
    const el = render(0.0000061026, 1.2e-8, 'S·sⁿ');
    expect(el.querySelector('sup')!.textContent).toBe('−6');
    expect(el.textContent).toBe('(6.103 ± 0.012) × 10−6 S·sⁿ');
  });

  it('uses an SI prefix for a simple unit and no superscript', () => {
    const el = render(0.0000061026, 1.2e-8, 'F');
    expect(el.querySelector('sup')).toBeNull();
    expect(el.textContent!.trim()).toBe('6.103 ± 0.012 µF');
  });
});

describe('ParameterSymbol', () => {
  it('writes R∞ with the ∞ as a subscript', () => {
    const fixture = TestBed.createComponent(ParameterSymbol);
    fixture.componentRef.setInput('name', 'rInf');
    fixture.detectChanges();
    const el = fixture.nativeElement as HTMLElement;
    expect(el.querySelector('sub')!.textContent).toBe('∞');
    expect(el.textContent).toBe('R∞');
  });
});
