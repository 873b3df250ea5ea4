import { IsNotEmpty, IsString, MaxLength } from 'class-validator';

export class SignInDto {
  @IsString({ message: 'email must be text' })
  @IsNotEmpty({ message: 'Enter your email address.' })
  @MaxLength(254, { message: 'email is longer than an email address can be (254 characters).' })
  email!: string;

  @IsString({ message: 'password must be text' })
  @IsNotEmpty({ message: 'Enter your password.' })
  @MaxLength(1024, { message: 'password is longer than 1024 characters.' })
  password!: string;
}
