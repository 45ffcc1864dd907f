import type { BikeRequest, UpdateBikeRequest } from '@loamline/shared-types';
import { ForkDto, Nested, ShockDto } from '../../baselines/dto/compute-baseline.dto';
import { NameField } from '../../common/dto/fields';

/**
 * `POST /api/bikes`: a name and the fork and shock as the compute API takes them (validated by the
 * same DTO classes), so a stored bike fills the wizard's Bike step as is. A missing part is null.
 */
export class CreateBikeDto implements BikeRequest {
  @NameField(100, '160 mm enduro bike')
  name: string;

  @Nested(() => ForkDto, { optional: true, nullable: true })
  fork?: ForkDto | null;

  @Nested(() => ShockDto, { optional: true, nullable: true })
  shock?: ShockDto | null;
}

/** `PATCH /api/bikes/:id`: any of the fields; a part sent replaces the stored part whole (null removes it). */
export class UpdateBikeDto implements UpdateBikeRequest {
  @NameField(100, '160 mm enduro bike', { optional: true })
  name?: string;

  @Nested(() => ForkDto, { optional: true, nullable: true })
  fork?: ForkDto | null;

  @Nested(() => ShockDto, { optional: true, nullable: true })
  shock?: ShockDto | null;
}
