import { ArrayMaxSize, ArrayMinSize, IsArray, IsInt, IsOptional, IsString, Length, Matches, Min } from 'class-validator';

import { STANDARDIZATION_MEANINGS } from '../../contract/runs';
import { SignatureFields } from '../runs/review-dto';
import { TEXT_LIMITS } from '../../contract/text-limits';

/** What an approval of a standardization means, in the signer's choice of words from the contract's fixed list. */
export const standardizationMeanings = STANDARDIZATION_MEANINGS;

export class ApproveStandardizationDto extends SignatureFields {
  @IsArray({ message: 'runIds must be a list of run ids' }) @ArrayMinSize(1, { message: 'runIds must name at least one run' }) @ArrayMaxSize(200, { message: 'runIds names at most 200 runs' })
  @IsInt({ each: true, message: 'runIds must hold run ids (whole numbers)' }) @Min(1, { each: true, message: 'runIds must hold run ids (whole numbers)' })
  runIds!: number[];
}

export class ApparatusChangeDto {
  @IsString({ message: 'description must be text' }) @Length(5, TEXT_LIMITS.reason, { message: `description must say what was changed (5 to ${TEXT_LIMITS.reason} characters)` })
  description!: string;

  @IsOptional() @IsString() @Matches(/^\d{4}-\d{2}-\d{2}$/, { message: 'changedOn must be a date such as 2026-03-14' })
  changedOn?: string;
}
