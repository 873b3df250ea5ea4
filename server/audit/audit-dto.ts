import { Type } from 'class-transformer';
import { IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min } from 'class-validator';
import { IsCalendarDay } from '../core/validators';

export class AuditQuery {
  @IsOptional() @Type(() => Number) @IsInt({ message: 'page must be a whole number' }) @Min(1, { message: 'page starts at 1' })
  page = 1;

  @IsOptional() @Type(() => Number) @IsInt({ message: 'pageSize must be a whole number' }) @Min(1) @Max(500, { message: 'pageSize is at most 500' })
  pageSize = 50;

  @IsOptional() @Type(() => Number) @IsInt({ message: 'run must be a run id' })
  run?: number;

  @IsOptional() @Type(() => Number) @IsInt({ message: 'person must be a person id' })
  person?: number;

  @IsOptional() @IsString() @MaxLength(64) @Matches(/^[a-z.-]+$/, { message: 'action must look like run.submit' })
  action?: string;

  @IsOptional() @IsString() @MaxLength(32) @Matches(/^[a-z-]+$/, { message: 'entityType must look like run or instrument' })
  entityType?: string;

  @IsOptional() @IsCalendarDay({ message: 'from must be a date like 2026-03-14' })
  from?: string;

  @IsOptional() @IsCalendarDay({ message: 'to must be a date like 2026-03-14' })
  to?: string;
}
