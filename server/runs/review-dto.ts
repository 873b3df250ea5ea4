import { IsInt, IsOptional, IsString, Length, MaxLength } from 'class-validator';
import type { SignatureRequest } from '../../contract/api/runs';
import { REVIEW_ACTIONS, SIGNATURE_MEANINGS, type ReviewAction } from '../../contract/runs';

/** What a signature means, in the signer's own choice of words from the contract's fixed list. */
export const approvalMeanings = SIGNATURE_MEANINGS.approve;
export const returnMeanings = SIGNATURE_MEANINGS.return;
export const rejectionMeanings = SIGNATURE_MEANINGS.reject;

/** The fields of every electronic signature: the signer's password again, the meaning, an optional reason. */
export class SignatureFields {
  @IsString({ message: 'password must be text' }) @Length(1, 1024, { message: 'Enter your password to sign.' })
  password!: string;

  @IsString({ message: 'meaning must be text' }) @Length(1, 200, { message: 'Choose what your signature means.' })
  meaning!: string;

  @IsOptional() @IsString({ message: 'reason must be text' }) @MaxLength(4000, { message: 'reason is at most 4000 characters' })
  reason?: string;
}

export class SignatureDto extends SignatureFields implements SignatureRequest {
  @IsInt({ message: 'version must be the version of the run you reviewed (a whole number)' })
  version!: number;
}

export type { ReviewAction };
export const isReviewAction = (v: string): v is ReviewAction => (REVIEW_ACTIONS as readonly string[]).includes(v);
