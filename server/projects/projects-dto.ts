import { IsArray, IsInt, IsString, Length, Matches, MaxLength } from 'class-validator';
import { TEXT_LIMITS, tooLongMessage } from '../../contract/text-limits';

/** POST /api/projects */
export class CreateProjectDto {
  @IsString() @Matches(/^[A-Z0-9]{1,12}$/, { message: 'code must be 1 to 12 capitals or digits (e.g. GX)' })
  code!: string;

  @IsString() @Length(3, TEXT_LIMITS.name, { message: `name must be 3 to ${TEXT_LIMITS.name} characters` })
  name!: string;

  @IsString({ message: 'description must be text' }) @MaxLength(TEXT_LIMITS.reason, { message: tooLongMessage('description', TEXT_LIMITS.reason) })
  description = '';
}

/** PUT /api/projects/:id/members: the whole new member list. */
export class MembersDto {
  @IsArray({ message: 'personIds must be a list of person ids' }) @IsInt({ each: true, message: 'personIds must be whole numbers' })
  personIds!: number[];
}
