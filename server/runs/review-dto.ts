import { IsInt, IsOptional, IsString, Length, MaxLength } from 'class-validator';

/** What a signature means, in the signer's own choice of words from a fixed list. */
export const approvalMeanings = ['I have reviewed this run and approve its results', 'I approve this run for release from the lab'] as const;
export const returnMeanings = ['I have reviewed this run and return it for correction'] as const;
export const rejectionMeanings = ['I have reviewed this run and reject its results'] as const;

/** The fields of every electronic signature: the signer's password again, the meaning, an optional reason. */
export class SignatureFields {
  @IsString({ message: 'password must be text' }) @Length(1, 1024, { message: 'Enter your password to sign.' })
  password!: string;

  @IsString({ message: 'meaning must be text' }) @Length(1, 200, { message: 'Choose what your signature means.' })
  meaning!: string;

  @IsOptional() @IsString({ message: 'reason must be text' }) @MaxLength(4000, { message: 'reason is at most 4000 characters' })
  reason?: string;
}

export class SignatureDto extends SignatureFields {
  @IsInt({ message: 'version must be the version of the run you reviewed (a whole number)' })
  version!: number;
}

export const reviewActions = ['approve', 'return', 'reject'] as const;
export type ReviewAction = (typeof reviewActions)[number];
export const isReviewAction = (v: string): v is ReviewAction => (reviewActions as readonly string[]).includes(v);
