import { IsInt, IsNotEmpty, IsOptional, IsString, MaxLength } from 'class-validator';
import type { SignatureRequest } from '../../contract/api/runs';
import { REVIEW_ACTIONS, SIGNATURE_MEANINGS, type ReviewAction } from '../../contract/runs';
import { TEXT_LIMITS, tooLongMessage } from '../../contract/text-limits';

/** What a signature means, in the signer's own choice of words from the contract's fixed list. */
export const approvalMeanings = SIGNATURE_MEANINGS.approve;
export const returnMeanings = SIGNATURE_MEANINGS.return;
export const rejectionMeanings = SIGNATURE_MEANINGS.reject;

/** The fields of every electronic signature: the signer's password again, the meaning, an optional reason. */
export class SignatureFields {
  @IsString({ message: 'password must be text' }) @IsNotEmpty({ message: 'Enter your password to sign.' }) @MaxLength(1024, { message: tooLongMessage('password', 1024) })
  password!: string;

  @IsString({ message: 'meaning must be text' }) @IsNotEmpty({ message: 'Choose what your signature means.' }) @MaxLength(TEXT_LIMITS.name, { message: tooLongMessage('meaning', TEXT_LIMITS.name) })
  meaning!: string;

  @IsOptional() @IsString({ message: 'reason must be text' }) @MaxLength(TEXT_LIMITS.signatureReason, { message: tooLongMessage('reason', TEXT_LIMITS.signatureReason) })
  reason?: string;
}

export class SignatureDto extends SignatureFields implements SignatureRequest {
  @IsInt({ message: 'version must be the version of the run you reviewed (a whole number)' })
  version!: number;
}

export type { ReviewAction };
export const isReviewAction = (v: string): v is ReviewAction => (REVIEW_ACTIONS as readonly string[]).includes(v);
