import { BadRequestException, Injectable } from '@nestjs/common';
import type { BaselineInput, BaselineResult, SagCheckInput, SagCheckResult } from '@loamline/shared-types';
import { computeBaseline, sagCheck, SpringModelInputError } from './spring-model';

/**
 * The spring model behind the baseline routes, for this module's controller and for other modules
 * (baseline sheets store what `compute` answers). A model input error becomes a 400 naming the field.
 */
@Injectable()
export class BaselinesService {
  compute(input: BaselineInput): BaselineResult {
    return this.run(() => computeBaseline(input));
  }

  sagCheck(input: SagCheckInput): SagCheckResult {
    return this.run(() => sagCheck(input));
  }

  private run<T>(fn: () => T): T {
    try {
      return fn();
    } catch (e) {
      if (e instanceof SpringModelInputError) {
        throw new BadRequestException({
          message: `${e.field}: ${e.message}`,
          fields: { [e.field]: e.message },
        });
      }
      throw e;
    }
  }
}
