import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { formatQuantity, formatSymbol, type QuantityPart, type Notation } from '@ohmprint/contracts';

/**
 * A value (± its standard error) in the one number format the report PDF uses too: digits matched to
 * the SE, powers of ten as real superscripts, SI prefixes. Screen readers get the plain text.
 *   <ohm-quantity [value]="p.value" [standardError]="p.standardError" unit="F" />
 */
@Component({
  selector: 'ohm-quantity',
  changeDetection: ChangeDetectionStrategy.OnPush,
  host: { class: 'ohm-quantity' },
  // One line: whitespace between the runs would print as a gap (10 ⁻⁶, R ∞).
  template: `@for (part of parts(); track $index) {@if (part.role === 'sup') {<sup>{{ part.text }}</sup>} @else if (part.role === 'sub') {<sub>{{ part.text }}</sub>} @else {<span>{{ part.text }}</span>}}`,
  styles: `
    :host {
      white-space: nowrap;
      font-variant-numeric: tabular-nums;
    }
    sup,
    sub {
      font-size: 0.72em;
      line-height: 0;
    }
  `,
})
export class Quantity {
  readonly value = input.required<number>();
  readonly standardError = input<number | null | undefined>(null);
  readonly unit = input<string>('');
  readonly significant = input<number>(4);
  readonly notation = input<Notation>('auto');

  protected readonly parts = computed<readonly QuantityPart[]>(
    () =>
      formatQuantity(this.value(), {
        standardError: this.standardError(),
        unit: this.unit(),
        significant: this.significant(),
        notation: this.notation(),
      }).parts,
  );
}

/** A parameter's symbol with its subscript: 'rInf' → R∞, 'cdl' → C with subscript dl. */
@Component({
  selector: 'ohm-symbol',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `@for (part of parts(); track $index) {@if (part.role === 'sub') {<sub>{{ part.text }}</sub>} @else {<span>{{ part.text }}</span>}}`,
  styles: `
    sub {
      font-size: 0.72em;
      line-height: 0;
    }
  `,
})
export class ParameterSymbol {
  readonly name = input.required<string>();
  protected readonly parts = computed(() => formatSymbol(this.name()).parts);
}
