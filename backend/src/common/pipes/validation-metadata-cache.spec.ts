import 'reflect-metadata';
import { type ArgumentMetadata, BadRequestException } from '@nestjs/common';
import { IsInt, IsString, Max, getMetadataStorage } from 'class-validator';
import { ComputeBaselineDto } from '../../baselines/dto/compute-baseline.dto';
import { LIMITS } from '../../baselines/spring-model/limits';
import { createValidationPipe } from './validation.pipe';

const meta: ArgumentMetadata = { type: 'body', metatype: ComputeBaselineDto };
const body = (): Record<string, unknown> => ({
  rider: { massKg: 80 },
  riding: { style: 'trail', feel: 'balanced' },
  fork: { travelMm: 140, stanchionMm: 34, spring: 'air', spacers: 1 },
});

async function fields(pipe: ReturnType<typeof createValidationPipe>, value: unknown, metatype = meta) {
  try {
    await pipe.transform(value, metatype);
    return null;
  } catch (e) {
    if (!(e instanceof BadRequestException)) throw e;
    return (e.getResponse() as { fields: Record<string, string> }).fields;
  }
}

describe('class-validator metadata kept per class (validation-metadata-cache.ts)', () => {
  it('the same rules on every request: nested limits, unknown fields, wrong types', async () => {
    const pipe = createValidationPipe();
    for (let i = 0; i < 3; i++) {
      // source: the DTO's own rules — compute-baseline.dto.ts (InRange(LIMITS.massKg), IsIn(RIDING_STYLES))
      expect(await fields(pipe, body())).toBeNull();
      expect(await fields(pipe, { ...body(), rider: { massKg: LIMITS.massKg.max + 1 } })).toHaveProperty([
        'rider.massKg',
      ]);
      expect(await fields(pipe, { ...body(), riding: { style: 'rodeo', feel: 'balanced' } })).toHaveProperty([
        'riding.style',
      ]);
      // source: setup of the global pipe — validation.pipe.ts (whitelist + forbidNonWhitelisted)
      expect(await fields(pipe, { ...body(), rider: { massKg: 80, extra: 1 } })).toHaveProperty([
        'rider.extra',
      ]);
      expect(await fields(pipe, { ...body(), fork: 'air' })).toHaveProperty(['fork']);
    }
  });

  it('a class whose rules register after the first validation is checked by them', async () => {
    const pipe = createValidationPipe();
    expect(await fields(pipe, body())).toBeNull();
    class LateDto {
      @IsInt()
      @Max(3)
      count: number;

      @IsString()
      label: string;
    }
    const late: ArgumentMetadata = { type: 'body', metatype: LateDto };
    // source: the decorators just above
    expect(await fields(pipe, { count: 4, label: 'x' }, late)).toEqual({
      count: expect.any(String) as string,
    });
    expect(await fields(pipe, { count: 2, label: 'x' }, late)).toBeNull();
  });

  it('kept look-ups are frozen, so no caller can change the next request’s rules', () => {
    createValidationPipe();
    const list = getMetadataStorage().getTargetValidationMetadatas(
      ComputeBaselineDto,
      '',
      false,
      false,
      undefined,
    );
    expect(list.length).toBeGreaterThan(0);
    expect(Object.isFrozen(list)).toBe(true);
    expect(
      getMetadataStorage().getTargetValidationMetadatas(ComputeBaselineDto, '', false, false, undefined),
    ).toBe(list);
  });
});
