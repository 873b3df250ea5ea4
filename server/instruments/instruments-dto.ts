import { Type } from 'class-transformer';
import { IsIn, IsNumber, IsObject, IsOptional, IsPositive, IsString, Length, Matches, MaxLength, Min, ValidateNested } from 'class-validator';
import { IsCalendarDay, Trimmed } from '../core/validators';
import { INSTRUMENT_KINDS, type InstrumentKind } from '../../contract/channels';
import { TEXT_LIMITS, tooLongMessage } from '../../contract/text-limits';

export class InstrumentSpecDto {
  @IsOptional() @IsNumber({}, { message: 'percentOfReading must be a number' }) @Min(0, { message: 'percentOfReading cannot be negative' })
  percentOfReading?: number;

  @IsOptional() @IsNumber({}, { message: 'percentOfFullScale must be a number' }) @Min(0, { message: 'percentOfFullScale cannot be negative' })
  percentOfFullScale?: number;

  @IsOptional() @IsNumber({}, { message: 'fullScale must be a number' }) @Min(0, { message: 'fullScale cannot be negative' })
  fullScale?: number;

  @IsOptional() @IsNumber({}, { message: 'resolution must be a number' }) @Min(0, { message: 'resolution cannot be negative' })
  resolution?: number;
}

export class CreateInstrumentDto {
  @IsString() @Matches(/^[A-Z0-9][A-Z0-9-]{0,31}$/, { message: 'tag must be the lab\'s tag in capitals, digits and dashes, at most 32 characters (e.g. PG-4)' })
  tag!: string;

  @Trimmed() @IsString() @Length(3, TEXT_LIMITS.name, { message: `name must be 3 to ${TEXT_LIMITS.name} characters` })
  name!: string;

  @IsIn(INSTRUMENT_KINDS, { message: `kind must be one of ${INSTRUMENT_KINDS.join(', ')}` })
  kind!: InstrumentKind;

  @IsString() @Length(1, TEXT_LIMITS.unit, { message: `unit must be 1 to ${TEXT_LIMITS.unit} characters (the unit the instrument reads in, e.g. kPa)` })
  unit!: string;

  @IsOptional() @IsString() @MaxLength(TEXT_LIMITS.name, { message: tooLongMessage('manufacturer', TEXT_LIMITS.name) })
  manufacturer?: string;

  @IsOptional() @IsString() @MaxLength(TEXT_LIMITS.certificate, { message: tooLongMessage('serialNumber', TEXT_LIMITS.certificate) })
  serialNumber?: string;

  @IsOptional() @IsNumber({}, { message: 'rangeMin must be a number' })
  rangeMin?: number;

  @IsOptional() @IsNumber({}, { message: 'rangeMax must be a number' })
  rangeMax?: number;

  @IsOptional() @IsObject({ message: 'spec must be an object' }) @ValidateNested() @Type(() => InstrumentSpecDto)
  spec?: InstrumentSpecDto;
}


/** The correction a certificate states, in the instrument's unit: the balance check reads each reading as reading × gain + offset. */
export class CalibrationCorrectionsDto {
  @IsOptional() @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'corrections.offset must be a number (in the instrument\'s unit)' })
  offset?: number;

  @IsOptional() @IsNumber({ allowNaN: false, allowInfinity: false }, { message: 'corrections.gain must be a number' }) @IsPositive({ message: 'corrections.gain must be greater than 0 (1 means no gain correction)' })
  gain?: number;
}

export class CreateCalibrationDto {
  @IsCalendarDay({ message: 'calibratedOn must be a date like 2026-03-14' })
  calibratedOn!: string;

  @IsCalendarDay({ message: 'dueOn must be a date like 2027-03-14' })
  dueOn!: string;

  @IsString() @Length(2, TEXT_LIMITS.certificate, { message: `certificate must name the certificate (2 to ${TEXT_LIMITS.certificate} characters)` })
  certificate!: string;

  @IsNumber({}, { message: 'expandedUncertainty must be a number (U, in the instrument\'s unit)' }) @Min(0, { message: 'expandedUncertainty cannot be negative' })
  expandedUncertainty!: number;

  @IsOptional() @IsNumber({}, { message: 'coverageFactor must be a number' }) @Min(1, { message: 'coverageFactor is at least 1' })
  coverageFactor?: number;

  @IsOptional() @IsObject({ message: 'corrections must be { offset?, gain? }' }) @ValidateNested() @Type(() => CalibrationCorrectionsDto)
  corrections?: CalibrationCorrectionsDto;

  @IsOptional() @IsString() @MaxLength(TEXT_LIMITS.reason, { message: tooLongMessage('notes', TEXT_LIMITS.reason) })
  notes?: string;
}
