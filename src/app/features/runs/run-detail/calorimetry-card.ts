import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { RouterLink } from '@angular/router';

import { CalorimetryResult, METHOD_LABEL } from '../calorimetry.models';
import { RiseChart } from './rise-chart';

/** Corrected temperature rise, fitted heat leak and (for a standardization run) the energy equivalent. */
@Component({
  selector: 'qw-calorimetry-card',
  imports: [DecimalPipe, RiseChart, RouterLink],
  template: `
    @if (result().temperatureRise; as rise) {
      @if (temperature(); as T) {
        <qw-rise-chart [time]="time()" [temperature]="T" [rise]="rise" />
      }
      <dl class="facts">
        <dt>Periods ({{ rise.periods.source === 'document' ? 'from the run' : 'detected' }})</dt>
        <dd>fore-period readings 1–{{ rise.periods.startReading }}, main period {{ rise.periods.mainStart | number: '1.0-1' }}–{{ rise.periods.mainEnd | number: '1.0-1' }} s, after-period readings {{ rise.periods.endReading }}–{{ rise.periods.endReading + rise.periods.afterReadings - 1 }}</dd>
        <dt>Drifts</dt>
        <dd>fore {{ rise.drift.fore.rate * 1000 | number: '1.3-3' }} ± {{ rise.drift.fore.u * 1000 | number: '1.3-3' }} mK/s, after {{ rise.drift.after.rate * 1000 | number: '1.3-3' }} ± {{ rise.drift.after.u * 1000 | number: '1.3-3' }} mK/s</dd>
        <dt>Observed rise</dt>
        <dd>{{ rise.observed | number: '1.4-4' }} K</dd>
        <dt>Corrected rise (used: {{ label(rise.method) }})</dt>
        <dd><strong>{{ rise.corrected.value | number: '1.4-4' }} ± {{ rise.corrected.u | number: '1.4-4' }} K</strong></dd>
        <dt>{{ label(rise.alternative.method) }}</dt>
        <dd>{{ rise.alternative.value | number: '1.4-4' }} ± {{ rise.alternative.u | number: '1.4-4' }} K</dd>
        @if (result().heatLeakFit; as fit) {
          <dt>Newton's-law fit of the drifts</dt>
          <dd>
            k = {{ fit.k.value * 1e6 | number: '1.2-2' }} ± {{ fit.k.u * 1e6 | number: '1.2-2' }} × 10⁻⁶ 1/s,
            convergence temperature {{ fit.convergenceTemperature.value | number: '1.2-2' }} ± {{ fit.convergenceTemperature.u | number: '1.2-2' }} K
            @if (fit.h; as h) { , h = k·C = {{ h.value | number: '1.3-3' }} ± {{ h.u | number: '1.3-3' }} W/K }
          </dd>
        }
        @if (result().energyEquivalent; as e) {
          <dt>Energy equivalent (standardization run)</dt>
          <dd><strong>ε = {{ e.value | number: '1.1-1' }} ± {{ e.u | number: '1.1-1' }} J/K</strong> = {{ e.knownHeat.value | number: '1.1-1' }} J ({{ e.knownHeat.description }}) / corrected rise</dd>
        }
        @if (result().standardization; as s) {
          <dt>Standardization used</dt>
          <dd>ε = {{ s.energyEquivalent.value | number: '1.1-1' }} ± {{ s.energyEquivalent.u | number: '1.1-1' }} J/K, in force from {{ s.effectiveFrom }}, signed by {{ s.signedBy }}
            @if (apparatusId(); as a) { (<a [routerLink]="['/apparatus', a]">series</a>) }</dd>
        }
      </dl>
    } @else {
      <p>No corrected rise: see the flags below for why.</p>
    }
  `,
  styles: `
    .facts { display: grid; grid-template-columns: max-content 1fr; gap: 0.25rem 1rem; margin: 1rem 0 0; }
    dt { color: var(--mat-sys-on-surface-variant); }
    dd { margin: 0; }
    @media (max-width: 40rem) { .facts { grid-template-columns: 1fr; } dd { margin-bottom: 0.5rem; } }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CalorimetryCard {
  readonly result = input.required<CalorimetryResult>();
  readonly time = input.required<readonly number[]>();
  readonly temperature = input<readonly number[] | null>(null);
  readonly apparatusId = input<number | null>(null);

  protected readonly hasRise = computed(() => !!this.result().temperatureRise);
  protected label(method: string): string {
    return METHOD_LABEL[method] ?? method;
  }
}
