import { Pipe, PipeTransform } from '@angular/core';

import { unitSymbol } from '@contract';

/** `'degC' | unitSymbol` → "°C", `'m3' | unitSymbol` → "m³": a unit code as the lab reads it. */
@Pipe({ name: 'unitSymbol' })
export class UnitSymbolPipe implements PipeTransform {
  transform(unit: string | null | undefined): string {
    return unit ? unitSymbol(unit) : '';
  }
}
