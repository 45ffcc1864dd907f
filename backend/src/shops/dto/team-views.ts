import { ApiProperty } from '@nestjs/swagger';
import {
  STAFF_ROLES,
  type InvitationLookup,
  type InvitationView,
  type ShopSummary,
  type StaffRole,
  type TeamMember,
  type TeamResponse,
} from '@loamline/shared-types';

/** OpenAPI shapes of the team answers (the types live in shared-types). */
export class ShopSummaryView implements ShopSummary {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty({ example: 'kettle-ridge-suspension-lab' }) slug: string;
  @ApiProperty() name: string;
  @ApiProperty() town: string;
  @ApiProperty({ example: 'America/Denver' }) timeZone: string;
  @ApiProperty({ example: 'USD' }) currency: string;
}

export class InvitationViewDoc implements InvitationView {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty() email: string;
  @ApiProperty({ enum: STAFF_ROLES }) role: StaffRole;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
  @ApiProperty({ format: 'date-time' }) expiresAt: string;
  @ApiProperty({ type: String, nullable: true }) invitedByName: string | null;
}

export class InvitationLookupView implements InvitationLookup {
  @ApiProperty() shopName: string;
  @ApiProperty() email: string;
  @ApiProperty({ enum: STAFF_ROLES }) role: StaffRole;
}

export class TeamMemberView implements TeamMember {
  @ApiProperty({ format: 'uuid' }) id: string;
  @ApiProperty() name: string;
  @ApiProperty() email: string;
  @ApiProperty({ enum: STAFF_ROLES }) role: StaffRole;
  @ApiProperty({ format: 'date-time' }) createdAt: string;
}

export class TeamResponseView implements TeamResponse {
  @ApiProperty({ type: ShopSummaryView }) shop: ShopSummaryView;
  @ApiProperty({ type: [TeamMemberView] }) members: TeamMemberView[];
  @ApiProperty({ type: [InvitationViewDoc] }) invitations: InvitationViewDoc[];
}
