import { IsBoolean, IsEmail, IsIn, IsString, Length, MaxLength } from 'class-validator';
import { IsOptionalNotNull, Trimmed } from '../core/validators';
import { roles, type Role } from '../../db/schema';
import { TEXT_LIMITS, tooLongMessage } from '../../contract/text-limits';

/** ASVS 2.1.1: new passwords are at least 12 characters. */
export const MIN_PASSWORD_LENGTH = 12;

export class CreatePersonDto {
  @IsEmail({}, { message: 'email must be an email address' }) @MaxLength(TEXT_LIMITS.email, { message: tooLongMessage('email', TEXT_LIMITS.email) })
  email!: string;

  @Trimmed() @IsString() @Length(2, TEXT_LIMITS.name, { message: `name must be 2 to ${TEXT_LIMITS.name} characters` })
  name!: string;

  @IsIn(roles, { message: `role must be one of ${roles.join(', ')}` })
  role!: Role;

  @IsString() @Length(MIN_PASSWORD_LENGTH, 1024, { message: `password must be at least ${MIN_PASSWORD_LENGTH} characters` })
  password!: string;
}

export class UpdatePersonDto {
  @IsOptionalNotNull() @Trimmed() @IsString() @Length(2, TEXT_LIMITS.name, { message: `name must be 2 to ${TEXT_LIMITS.name} characters` })
  name?: string;

  @IsOptionalNotNull() @IsIn(roles, { message: `role must be one of ${roles.join(', ')}` })
  role?: Role;

  @IsOptionalNotNull() @IsBoolean({ message: 'active must be true or false' })
  active?: boolean;

  /** true clears a lockout. */
  @IsOptionalNotNull() @IsBoolean({ message: 'unlock must be true or false' })
  unlock?: boolean;

  @IsOptionalNotNull() @IsString() @Length(MIN_PASSWORD_LENGTH, 1024, { message: `password must be at least ${MIN_PASSWORD_LENGTH} characters` })
  password?: string;
}
