import { ApiProperty } from '@nestjs/swagger';
import {
  ROLES,
  type AuthUser,
  type RegisterResponse,
  type Role,
  type SignInResponse,
} from '@loamline/shared-types';

/** OpenAPI shapes of the answers (the types themselves live in shared-types). */
export class AuthUserView implements AuthUser {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ example: 'rider@example.test' }) email: string;
  @ApiProperty({ example: 'Sam' }) name: string;
  @ApiProperty({ enum: ROLES }) role: Role;
  @ApiProperty({ format: 'uuid', nullable: true, type: String }) shopId: string | null;
}

export class RegisterResponseView implements RegisterResponse {
  @ApiProperty({ type: AuthUserView }) user: AuthUserView;
}

export class SignInResponseView implements SignInResponse {
  @ApiProperty({ type: AuthUserView }) user: AuthUserView;
  @ApiProperty({ description: 'the session JWT (HS256), also usable as `Authorization: Bearer`' })
  accessToken: string;
}
