import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { AxisTick, PlotArea } from './chart-types';

/**
 * Frame, grid, tick labels and axis titles of one plot area. Drawn inside the host chart's
 * `<svg>`, so it is an attribute on a `<g>`: SVG has no place for custom elements.
 */
@Component({
  // eslint-disable-next-line @angular-eslint/component-selector -- must be an SVG <g>, see above
  selector: 'g[ohmChartAxes]',
  changeDetection: ChangeDetectionStrategy.OnPush,
  styleUrl: './chart-svg.css',
  template: `
    <svg:rect class="plot-bg" [attr.x]="area().left" [attr.y]="area().top" [attr.width]="area().width" [attr.height]="area().height" />
    @for (t of yTicks(); track $index) {
      <svg:line class="grid" [class.minor]="!t.major" [attr.x1]="area().left" [attr.x2]="area().left + area().width" [attr.y1]="t.position" [attr.y2]="t.position" />
      @if (t.label) {
        <svg:text class="tick-label" text-anchor="end" dy="0.32em" [attr.x]="area().left - 6" [attr.y]="t.position">{{ t.label }}</svg:text>
      }
    }
    @for (t of xTicks(); track $index) {
      <svg:line class="grid" [class.minor]="!t.major" [attr.y1]="area().top" [attr.y2]="area().top + area().height" [attr.x1]="t.position" [attr.x2]="t.position" />
      @if (t.label) {
        <svg:text class="tick-label" text-anchor="middle" dy="1.1em" [attr.x]="t.position" [attr.y]="area().top + area().height + 4">{{ t.label }}</svg:text>
      }
    }
    @if (xLabel()) {
      <svg:text class="axis-label" text-anchor="middle" [attr.x]="area().left + area().width / 2" [attr.y]="area().top + area().height + 34">{{ xLabel() }}</svg:text>
    }
    @if (yLabel()) {
      <svg:text class="axis-label" text-anchor="middle" [attr.transform]="yLabelTransform()">{{ yLabel() }}</svg:text>
    }
  `,
})
export class ChartAxes {
  readonly area = input.required<PlotArea>();
  readonly xTicks = input<readonly AxisTick[]>([]);
  readonly yTicks = input<readonly AxisTick[]>([]);
  readonly xLabel = input('');
  readonly yLabel = input('');
  /** How far left of the plot the rotated y title sits, clear of the tick labels. */
  readonly yLabelOffset = input(52);

  protected yLabelTransform(): string {
    const a = this.area();
    return `translate(${a.left - this.yLabelOffset()},${a.top + a.height / 2}) rotate(-90)`;
  }
}
