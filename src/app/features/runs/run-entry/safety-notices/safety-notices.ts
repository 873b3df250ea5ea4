import { DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import { MatIconModule } from '@angular/material/icon';

/** Share of the rated pressure above which a reading is called out. */
export const RATED_PRESSURE_WARNING = 0.9;

/** Standard atmosphere in Pa (ISO 2533), the barometric pressure assumed until the run's own is entered. */
const STANDARD_ATMOSPHERE_PA = 101_325;

/**
 * The cautions a bench run needs: pressure (stay within the vessel's rating, with a warning once a
 * reading passes 90 % of it) and electrical heating (guard heaters and hot surfaces). They defer to
 * local codes and the lab's own safety review.
 */
@Component({
  selector: 'qw-safety-notices',
  imports: [DecimalPipe, MatIconModule],
  template: `
    @if (pressure()) {
      <div class="notice" role="note" aria-label="Pressure safety">
        <mat-icon aria-hidden="true">compress</mat-icon>
        <p>
          <strong>Pressure.</strong>
          @if (ratedPressurePa(); as rated) {
            Stay within the rated pressure of {{ apparatusName() }}:
            {{ rated / 1000 | number: '1.0-1' }} kPa ({{ rated / 100000 | number: '1.0-2' }} bar) {{ ratedReference() }}.
          } @else {
            Stay within the rated pressure of the vessel; this apparatus has no rating on record.
          }
          Check relief valves and fittings before you pressurise.
        </p>
      </div>
      @if (overLimit(); as over) {
        <div class="notice warning" role="alert">
          <mat-icon aria-hidden="true">warning</mat-icon>
          <p>
            <strong>Near the rating.</strong> A pressure reading of {{ over.kPa | number: '1.0-1' }} kPa {{ ratedReference() }} is
            {{ over.percent | number: '1.0-0' }} % of the rated pressure (above {{ warnPercent }} %).
            @if (over.assumedBarometer) {
              Until the barometric pressure is entered, it is taken as {{ standardAtmosphereKPa }} kPa.
            }
            Check the reading, and do not go higher without your lab's safety review.
          </p>
        </div>
      }
    }
    @if (heating()) {
      <div class="notice" role="note" aria-label="Electrical heating safety">
        <mat-icon aria-hidden="true">electric_bolt</mat-icon>
        <p>
          <strong>Electrical heating.</strong> Guard the heater, its leads and hot surfaces; switch the supply off
          before you touch the cell.
        </p>
      </div>
    }
    @if (pressure() || heating()) {
      <p class="defer">
        Qwell does not make a run safe: your local codes and your lab's own safety review take precedence over
        anything shown here.
      </p>
    }
  `,
  styles: `
    :host {
      display: block;
    }

    .notice {
      display: flex;
      gap: 0.75rem;
      align-items: flex-start;
      margin: 0 0 0.5rem;
      padding: 0.75rem 1rem;
      border-radius: var(--mat-sys-corner-small);
      border: 1px solid var(--mat-sys-outline-variant);
      background: var(--mat-sys-surface-container);

      p {
        margin: 0;
      }

      mat-icon {
        flex: none;
      }
    }

    .warning {
      background: var(--mat-sys-error-container);
      color: var(--mat-sys-on-error-container);
      border-color: var(--mat-sys-error);
    }

    .defer {
      margin: 0 0 1rem;
      color: var(--mat-sys-on-surface-variant);
      font: var(--mat-sys-body-medium);
    }
  `,
  changeDetection: ChangeDetectionStrategy.OnPush,
})
export class SafetyNotices {
  /** A pressure channel is recorded. */
  readonly pressure = input(false);
  /** A heater voltage, current or power channel is recorded. */
  readonly heating = input(false);
  readonly apparatusName = input('the apparatus');
  /** Rated pressure of the apparatus in Pa, when known. */
  readonly ratedPressurePa = input<number | null>(null);
  /** Whether the rating is absolute or gauge (above the barometric pressure). */
  readonly ratedReference = input<'absolute' | 'gauge'>('absolute');
  /** Highest pressure reading in Pa, as entered (gauge or absolute, as `pressureReference` says). */
  readonly highestPressurePa = input<number | null>(null);
  /** Whether the pressure readings are absolute or gauge. */
  readonly pressureReference = input<'absolute' | 'gauge'>('absolute');
  /** The run's barometric pressure in Pa, when entered. */
  readonly ambientPressurePa = input<number | null>(null);

  protected readonly warnPercent = RATED_PRESSURE_WARNING * 100;
  protected readonly standardAtmosphereKPa = STANDARD_ATMOSPHERE_PA / 1000;

  /**
   * The highest reading read in the rating's own terms, as the balance check compares them: absolute
   * pressure is the gauge reading plus the barometric pressure, and a gauge rating lies above it.
   */
  protected readonly overLimit = computed(() => {
    const rated = this.ratedPressurePa();
    const entered = this.highestPressurePa();
    if (!rated || entered === null) {
      return null;
    }
    const convert = this.pressureReference() !== this.ratedReference();
    const barometer = this.ambientPressurePa() ?? STANDARD_ATMOSPHERE_PA;
    const highest = !convert ? entered : this.ratedReference() === 'gauge' ? entered - barometer : entered + barometer;
    if (highest <= RATED_PRESSURE_WARNING * rated) {
      return null;
    }
    return { kPa: highest / 1000, percent: (highest / rated) * 100, assumedBarometer: convert && this.ambientPressurePa() === null };
  });
}
