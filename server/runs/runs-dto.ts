import { RUN_SORTS, type CreateRunBody, type ReadingsBody, type UpdateRunBody } from '../../contract/api/runs';
import { Type } from 'class-transformer';
import { IsIn, IsInt, IsObject, IsOptional, IsString, Length, Max, Min } from 'class-validator';
import { IsCalendarDay, IsOptionalNotNull, Trimmed } from '../core/validators';
import { processes, runStates, verdicts, type RunState } from '../../db/schema';
import type { ReadingsInput } from './run-document-mapper';
import type { RunSetup } from './run-setup';
import { TEXT_LIMITS } from '../../contract/text-limits';

type Process = (typeof processes)[number];

export const runSortKeys = RUN_SORTS;

export class RunListQuery {
  @IsOptional() @Type(() => Number) @IsInt({ message: 'page must be a whole number' }) @Min(1, { message: 'page starts at 1' })
  page = 1;

  @IsOptional() @Type(() => Number) @IsInt({ message: 'pageSize must be a whole number' }) @Min(1) @Max(200, { message: 'pageSize is at most 200' })
  pageSize = 25;

  @IsOptional() @IsIn(runStates, { message: `state must be one of ${runStates.join(', ')}` })
  state?: RunState;

  @IsOptional() @IsIn(verdicts, { message: `verdict must be one of ${verdicts.join(', ')}` })
  verdict?: (typeof verdicts)[number];

  @IsOptional() @Type(() => Number) @IsInt({ message: 'project must be a project id' })
  project?: number;

  @IsOptional() @Type(() => Number) @IsInt({ message: 'author must be a person id' })
  author?: number;

  @IsOptional() @IsIn(['true', 'false'], { message: 'mine must be true or false' })
  mine?: 'true' | 'false';

  /** Runs written by others: a reviewer's queue never holds their own runs. */
  @IsOptional() @IsIn(['true', 'false'], { message: 'others must be true or false' })
  others?: 'true' | 'false';

  @IsOptional() @IsIn(['over-pressure'], { message: 'safety must be over-pressure (runs whose readings went above the rated pressure)' })
  safety?: 'over-pressure';

  @IsOptional() @IsCalendarDay({ message: 'from must be a date like 2026-03-14' })
  from?: string;

  @IsOptional() @IsCalendarDay({ message: 'to must be a date like 2026-03-14' })
  to?: string;

  @IsOptional() @IsIn(runSortKeys, { message: `sort must be one of ${runSortKeys.join(', ')}` })
  sort: (typeof runSortKeys)[number] = 'updatedAt';

  @IsOptional() @IsIn(['asc', 'desc'], { message: 'dir must be asc or desc' })
  dir: 'asc' | 'desc' = 'desc';
}


export class CreateRunDto implements Omit<CreateRunBody, 'setup'> {
  @IsInt({ message: 'projectId must be the id of one of your projects' })
  projectId!: number;

  @Trimmed() @IsString({ message: 'title must be text' }) @Length(3, TEXT_LIMITS.title, { message: `title must be 3 to ${TEXT_LIMITS.title} characters` })
  title!: string;

  @IsIn(processes, { message: `process must be one of ${processes.join(', ')}` })
  process!: Process;

  @IsCalendarDay({ message: 'runDate must be a date like 2026-03-14' })
  runDate!: string;

  @IsOptional() @IsInt({ message: 'gasId must be the id of a gas' })
  gasId?: number;

  @IsOptional() @IsInt({ message: 'apparatusId must be the id of an apparatus' })
  apparatusId?: number;

  @IsOptional() @IsObject({ message: 'setup must be an object' })
  setup?: RunSetup;
}

export class UpdateRunDto implements Omit<UpdateRunBody, 'setup'> {
  @IsInt({ message: 'version must be the version of the run you are editing (a whole number)' })
  version!: number;

  @IsOptionalNotNull() @Trimmed() @IsString({ message: 'title must be text' }) @Length(3, TEXT_LIMITS.title, { message: `title must be 3 to ${TEXT_LIMITS.title} characters` })
  title?: string;

  @IsOptionalNotNull() @IsIn(processes, { message: `process must be one of ${processes.join(', ')}` })
  process?: Process;

  @IsOptionalNotNull() @IsCalendarDay({ message: 'runDate must be a date like 2026-03-14' })
  runDate?: string;

  @IsOptional() @IsInt({ message: 'gasId must be the id of a gas' })
  gasId?: number | null;

  @IsOptional() @IsInt({ message: 'apparatusId must be the id of an apparatus' })
  apparatusId?: number | null;

  @IsOptionalNotNull() @IsObject({ message: 'setup must be an object' })
  setup?: RunSetup;
}

export class ReplaceReadingsDto implements Pick<ReadingsBody, 'version'> {
  @IsInt({ message: 'version must be the version of the run you are editing (a whole number)' })
  version!: number;

  @IsObject({ message: 'time must be { unit, values }' })
  time!: ReadingsInput['time'];

  @IsObject({ message: 'channels must be an object of { unit, values, instrumentId?, reference? } per channel' })
  channels!: ReadingsInput['channels'];
}

export class VersionDto {
  @IsInt({ message: 'version must be the version of the run you are acting on (a whole number)' })
  version!: number;
}

export class ReviseDto {
  @Trimmed() @IsString() @Length(5, TEXT_LIMITS.reason, { message: `reason must say why the approved run is corrected (5 to ${TEXT_LIMITS.reason} characters)` })
  reason!: string;
}
