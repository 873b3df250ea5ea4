import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { RouterLink } from '@angular/router';

import { WithUncertaintyPipe } from '../../../shared/value-with-uncertainty/value-with-uncertainty-pipe';
import { CalorimetryResult, METHOD_LABEL } from '../calorimetry.models';

/**
 * Corrected temperature rise, fitted heat leak and (for a standardization run) the energy equivalent, as figures;
 * the periods, drifts and rise are drawn on the run's temperature chart. Uncertainties are standard uncertainties.
 */
@Component({
  selector: 'qw-calorimetry-card',
  imports: [DecimalPipe, RouterLink, WithUncertaintyPipe],
  template: `
    @if (result().temperatureRise; as rise) {
      <p class="note">Standard uncertainties (k = 1). The periods, fitted drift lines and corrected rise are drawn on the temperature chart.</p>
      <dl class="facts">
        <dt>Periods ({{ rise.periods.source === 'document' ? 'from the run' : 'detected' }})</dt>
        <dd>fore-period readings 1–{{ rise.periods.startReading }}, main period {{ rise.periods.mainStart | number: '1.0-1' }}–{{ rise.periods.mainEnd | number: '1.0-1' }} s, after-period readings {{ rise.periods.endReading }}–{{ rise.periods.endReading + rise.periods.afterReadings - 1 }}</dd>
        <dt>Drifts</dt>
        <dd>fore {{ rise.drift.fore.rate * 1000 | withUncertainty: rise.drift.fore.u * 1000 : 'mK/s' : null }}, after {{ rise.drift.after.rate * 1000 | withUncertainty: rise.drift.after.u * 1000 : 'mK/s' : null }}</dd>
        <dt>Observed rise</dt>
        <dd>{{ rise.observed | number: '1.4-4' }} K</dd>
        <dt>Corrected rise (used: {{ label(rise.method) }})</dt>
        <dd><strong>{{ rise.corrected.value | withUncertainty: rise.corrected.u : 'K' : null }}</strong>
          @if (rise.uncertainty; as parts) {
            <span class="parts">
              (u from the drift fits and reading scatter {{ parts.fit | number: '1.1-6' }} K;
              @if (parts.thermometerGain > 0) { thermometer gain {{ parts.thermometerGain | number: '1.1-6' }} K) } @else { the thermometer states no gain error) }
            </span>
          }
        </dd>
        <dt>{{ label(rise.alternative.method) }}</dt>
        <dd>{{ rise.alternative.value | withUncertainty: rise.alternative.u : 'K' : null }}</dd>
        @if (result().heatLeakFit; as fit) {
          <dt>Newton's-law fit of the drifts</dt>
          <dd>
            k = {{ fit.k.value * 1e6 | withUncertainty: fit.k.u * 1e6 : '' : null }} × 10⁻⁶ 1/s,
            convergence temperature {{ fit.convergenceTemperature.value | withUncertainty: fit.convergenceTemperature.u : 'K' : null }}@if (fit.h; as h) {, h = k·C = {{ h.value | withUncertainty: h.u : 'W/K' : null }}}
          </dd>
        }
        @if (result().energyEquivalent; as e) {
          <dt>Energy equivalent (standardization run)</dt>
          <dd><strong>ε = {{ e.value | withUncertainty: e.u : 'J/K' : null }}</strong> = {{ e.knownHeat.value | withUncertainty: e.knownHeat.u : 'J' : null }} ({{ e.knownHeat.description }}) / corrected rise</dd>
        }
        @if (result().standardization; as s) {
          <dt>Standardization used</dt>
          <dd>ε = {{ s.energyEquivalent.value | withUncertainty: s.energyEquivalent.u : 'J/K' : null }}@if (s.heatLossApplied && s.heatLossCoefficient; as h) { and its fitted h = {{ h.value | withUncertainty: h.u : 'W/K' : null }}},
            in force from {{ s.effectiveFrom }}, signed by {{ s.signedBy }}
            @if (apparatusId(); as a) { (<a [routerLink]="['/apparatus', a]">series</a>) }</dd>
        }
      </dl>
    } @else {
      <p>No corrected rise: see the flags below for why.</p>
    }
  `,
  styles: `
    .note { margin: 0; color: var(--mat-sys-on-surface-variant); }
    .facts { display: grid; grid-template-columns: max-content 1fr; gap: 0.25rem 1rem; margin: 1rem 0 0; }
    dt { color: var(--mat-sys-on-surface-variant); }
    dd { margin: 0; }
    .parts { color: var(--mat-sys-on-surface-variant); }
    @media (max-width: 40rem) { .facts { grid-template-columns: 1fr; } dd { margin-bottom: 0.5rem; } }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class CalorimetryCard {
  readonly result = input.required<CalorimetryResult>();
  readonly apparatusId = input<number | null>(null);

  protected label(method: string): string {
    return METHOD_LABEL[method] ?? method;
  }
}
