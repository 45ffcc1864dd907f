import type { CreateBaselineSheetRequest, RenameBaselineSheetRequest } from '@loamline/shared-types';
import { ComputeBaselineDto, Nested } from '../../baselines/dto/compute-baseline.dto';
import { NameField } from '../../common/dto/fields';

/** `POST /api/baseline-sheets`: the input is validated exactly as `POST /api/baselines/compute` validates it. */
export class CreateBaselineSheetDto implements CreateBaselineSheetRequest {
  @NameField(120, 'Trail bike, 82 kg')
  name: string;

  @Nested(() => ComputeBaselineDto)
  input: ComputeBaselineDto;
}

/** `PATCH /api/baseline-sheets/:id`: only the name changes; the input and result stay as computed. */
export class RenameBaselineSheetDto implements RenameBaselineSheetRequest {
  @NameField(120, 'Trail bike, winter')
  name: string;
}
