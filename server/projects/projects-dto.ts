import { IsArray, IsInt, IsString, Length, Matches } from 'class-validator';

/** POST /api/projects */
export class CreateProjectDto {
  @IsString() @Matches(/^[A-Z0-9]{1,12}$/, { message: 'code must be 1 to 12 capitals or digits (e.g. GX)' })
  code!: string;

  @IsString() @Length(3, 200, { message: 'name must be 3 to 200 characters' })
  name!: string;

  @IsString() @Length(0, 2000)
  description = '';
}

/** PUT /api/projects/:id/members: the whole new member list. */
export class MembersDto {
  @IsArray({ message: 'personIds must be a list of person ids' }) @IsInt({ each: true, message: 'personIds must be whole numbers' })
  personIds!: number[];
}
