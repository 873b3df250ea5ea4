import { Type } from 'class-transformer';
import { IsIn, IsInt, IsOptional, IsString, Matches, Max, MaxLength, Min } from 'class-validator';
import { IsCalendarDay } from '../core/validators';

export class AuditQuery {
  @IsOptional() @Type(() => Number) @IsInt({ message: 'page must be a whole number' }) @Min(1, { message: 'page starts at 1' })
  page = 1;

  @IsOptional() @Type(() => Number) @IsInt({ message: 'pageSize must be a whole number' }) @Min(1) @Max(500, { message: 'pageSize is at most 500' })
  pageSize = 50;

  /** A run code (all its revisions), or a run id. */
  @IsOptional() @IsString() @Matches(/^(\d{1,9}|R-\d{4}-\d{4,6})$/i, { message: 'run must be a run code like R-2026-0007' })
  run?: string;

  /** `hide` leaves sign-ins, sign-outs and failed sign-ins out. */
  @IsOptional() @IsIn(['hide', 'show'], { message: 'signIns must be hide or show' })
  signIns?: 'hide' | 'show';

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
