import { ApiProperty } from '@nestjs/swagger';
import { IsIn, IsString, Matches } from 'class-validator';
import {
  STAFF_ROLES,
  type AcceptInvitationRequest,
  type CreateInvitationRequest,
  type StaffRole,
} from '@loamline/shared-types';
import { LINK_TOKEN } from '../../auth/dto/password-reset.dto';
import { EmailField, NameField, NewPasswordField } from '../../common/dto/fields';

export class CreateInvitationDto implements CreateInvitationRequest {
  @EmailField()
  email: string;

  @ApiProperty({ enum: STAFF_ROLES })
  @IsIn(STAFF_ROLES, { message: `must be one of ${STAFF_ROLES.join(', ')}` })
  role: StaffRole;
}

export class AcceptInvitationDto implements AcceptInvitationRequest {
  @ApiProperty({ description: 'the token from the e-mailed link `/join?token=…`' })
  @IsString()
  @Matches(LINK_TOKEN, { message: 'is not an invitation token' })
  token: string;

  @NameField(100, 'Robin')
  name: string;

  @NewPasswordField()
  password: string;
}
