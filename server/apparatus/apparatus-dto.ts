import { IsIn, IsNumber, IsOptional, IsString, Length, Matches, MaxLength, Min } from 'class-validator';
import { TEXT_LIMITS, tooLongMessage } from '../../contract/text-limits';

/** POST /api/apparatus and PUT /api/apparatus/:id: the whole register entry, quantities in SI units. */
export class ApparatusDto {
  @IsString() @Matches(/^[A-Z0-9][A-Z0-9-]{0,31}$/, { message: 'tag must be the lab\'s tag in capitals, digits and dashes, at most 32 characters (e.g. PC-4)' })
  tag!: string;

  @IsString() @Length(3, TEXT_LIMITS.name, { message: `name must be 3 to ${TEXT_LIMITS.name} characters` })
  name!: string;

  @IsString() @Length(2, 50, { message: 'kind must say what it is in 2 to 50 characters (e.g. piston-cell, vessel, bath-calorimeter)' })
  kind!: string;

  @IsOptional() @IsNumber({}, { message: 'heatCapacity must be a number (J/K)' }) @Min(0) heatCapacity?: number | null;
  @IsOptional() @IsNumber({}, { message: 'heatCapacityU must be a number (J/K)' }) @Min(0) heatCapacityU?: number | null;
  @IsOptional() @IsNumber({}, { message: 'heatLossCoefficient must be a number (W/K)' }) @Min(0) heatLossCoefficient?: number | null;
  @IsOptional() @IsNumber({}, { message: 'heatLossCoefficientU must be a number (W/K)' }) @Min(0) heatLossCoefficientU?: number | null;
  @IsOptional() @IsNumber({}, { message: 'ratedPressure must be a number (Pa)' }) @Min(0) ratedPressure?: number | null;
  @IsOptional() @IsIn(['absolute', 'gauge'], { message: 'ratedPressureReference must be "absolute" or "gauge" (above the barometric pressure)' })
  ratedPressureReference?: 'absolute' | 'gauge';
  @IsOptional() @IsNumber({}, { message: 'bore must be a number (m)' }) @Min(0) bore?: number | null;
  @IsOptional() @IsNumber({}, { message: 'fixedVolume must be a number (m³)' }) @Min(0) fixedVolume?: number | null;
  @IsOptional() @IsString() @MaxLength(TEXT_LIMITS.reason, { message: tooLongMessage('notes', TEXT_LIMITS.reason) }) notes?: string;
}
