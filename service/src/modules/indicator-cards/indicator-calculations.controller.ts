import {
  BadRequestException,
  Body,
  Controller,
  HttpCode,
  HttpException,
  Post,
  Query,
  Req,
  UnprocessableEntityException,
  UnsupportedMediaTypeException,
} from '@nestjs/common';
import type { Request } from 'express';
import jpeg from 'jpeg-js';
import { PNG } from 'pngjs';
import { ApiBadRequestResponse, ApiBearerAuth, ApiBody, ApiConsumes, ApiOperation, ApiTags } from '@nestjs/swagger';
import { AnyRole } from '../../common/decorators/roles.decorator.js';
import { computeIndicatedPower } from '../../calculations/indicated-power.js';
import { autotraceCard } from '../../calculations/indicator-autotrace.js';
import { sniffImage } from '../../common/util/image-sniff.js';
import { ApiAnswer, ApiErrors } from '../../common/openapi/api-answer.decorator.js';
import {
  IndicatedPowerRequestDto,
  IndicatedPowerResponseDto,
  IndicatorAutotraceQueryDto,
  IndicatorAutotraceResponseDto,
  TraceCalibrationRequestDto,
  TraceCalibrationResponseDto,
} from './dto/calculations.dto.js';
import { calibrateCardTrace } from './card-set-results.js';
import { CardImagesService, readLimited } from './card-images.service.js';

/** A decoded photo larger than this is refused (the tracer works on far less). */
const MAX_AUTOTRACE_PIXELS = 40_000_000;

/** Stateless calculators for indicator cards (nothing is stored). */
@ApiTags('calculations')
@ApiBearerAuth()
@Controller('calculations')
export class IndicatorCalculationsController {
  constructor(private readonly images: CardImagesService) {}

  @Post('indicated-power')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({
    summary: 'Indicated power of a set of cards',
    description:
      'Each card gives exactly one of: meanEffectivePressurePsi; areaSqIn with lengthIn and springPsiPerIn; ' +
      'ordinatesIn with springPsiPerIn. ' +
      'IHP per end = P·L·A·N/33,000 (head end less any tail rod, crank end less the piston rod, N = rpm); ' +
      "referredMeanEffectivePressurePsi refers every cylinder's work to the largest cylinder's area. " +
      'A card with two ways or none, a non-positive dimension, a rod not smaller than its bore or two cards for one end ' +
      'answers 400 naming the field.',
  })
  @ApiBody({
    type: IndicatedPowerRequestDto,
    examples: {
      compound: {
        summary: 'A tandem pair at 64 rpm: the high-pressure cylinder by mean effective pressure, the low by planimeter area',
        value: {
          rpm: 64,
          strokeIn: 48,
          cylinders: [
            {
              label: 'HP',
              boreIn: 20,
              pistonRodIn: 4,
              tailRodIn: 0,
              cards: [
                { end: 'head', meanEffectivePressurePsi: 38.5 },
                { end: 'crank', meanEffectivePressurePsi: 36.2 },
              ],
            },
            {
              label: 'LP',
              boreIn: 36,
              pistonRodIn: 4,
              tailRodIn: 4,
              cards: [
                { end: 'head', areaSqIn: 1.1, lengthIn: 3.6, springPsiPerIn: 30 },
                { end: 'crank', areaSqIn: 1.05, lengthIn: 3.6, springPsiPerIn: 30 },
              ],
            },
          ],
        },
      },
    },
  })
  @ApiAnswer('IndicatedPowerResponse')
  @ApiBadRequestResponse({ description: 'The body is not valid; the message names the field, e.g. "cylinders[0].cards[1].areaSqIn: …".' })
  indicatedPower(@Body() dto: IndicatedPowerRequestDto): IndicatedPowerResponseDto {
    return computeIndicatedPower(dto);
  }

  @Post('indicator-trace')
  @HttpCode(200)
  @AnyRole()
  @ApiOperation({
    summary: 'Calibrate a traced card image',
    description:
      'The atmospheric line and the two ends of the diagram set the frame; the card length (or a known pixels-per-inch) sets the scale. ' +
      'Answers the area from the traced polygon (shoelace), mean height, mean effective pressure and the outline in card coordinates.',
  })
  @ApiAnswer('TraceCalibrationResponse')
  @ApiBadRequestResponse({ description: 'The trace or scale is not valid; the message names the field.' })
  indicatorTrace(@Body() dto: TraceCalibrationRequestDto): TraceCalibrationResponseDto {
    return calibrateCardTrace(dto.trace, dto.springPsiPerIn, dto.lengthIn);
  }

  /** The photo itself as the body (PNG or JPEG, judged by its bytes); the scale in the query. */
  @Post('indicator-autotrace')
  @HttpCode(200)
  @AnyRole()
  @ApiConsumes('image/png', 'image/jpeg', 'image/webp')
  @ApiBody({ schema: { type: 'string', format: 'binary' } })
  @ApiOperation({
    summary: 'Propose the trace of a card photo automatically',
    description:
      'Finds the atmospheric line and the closed outline of the diagram in the photo and answers the proposed trace (image pixels), ' +
      'its area (in²), mean effective pressure (psi), a confidence (0–1) and warnings. PNG and JPEG are read; WebP answers 415 ' +
      '(no WebP decoder on the server: the card editor traces WebP photos in the browser). 400 names the field for a bad image or ' +
      'scale; 422 gives the reasons when no single closed diagram is found.',
  })
  @ApiAnswer('IndicatorAutotraceResponse')
  @ApiErrors(413, 415, 422)
  @ApiBadRequestResponse({ description: 'The image or the scale is not valid; the message names the field.' })
  async indicatorAutotrace(@Query() q: IndicatorAutotraceQueryDto, @Req() req: Request): Promise<IndicatorAutotraceResponseDto> {
    const type = (req.headers['content-type'] ?? '').split(';')[0].trim().toLowerCase();
    if (!type.startsWith('image/') && type !== 'application/octet-stream') {
      req.resume();
      throw new UnsupportedMediaTypeException('Send the image itself as the body, with Content-Type image/png or image/jpeg.');
    }
    const max = this.images.maxBytes;
    if (Number(req.headers['content-length'] ?? 0) > max) {
      req.resume();
      throw new HttpException(
        { statusCode: 413, error: 'Payload Too Large', message: `image: larger than ${max} bytes; send a smaller photo.` },
        413,
      );
    }
    const body = await readLimited(req, max);
    const sniffed = await sniffImage(body);
    if (!sniffed) throw new BadRequestException('image: the body is not a PNG, JPEG or WebP image of a sensible size');
    if (sniffed.contentType === 'image/webp') {
      throw new UnsupportedMediaTypeException(
        'image: WebP is not read on the server; send a PNG or JPEG, or use the card editor, which reads WebP',
      );
    }
    if (sniffed.widthPx * sniffed.heightPx > MAX_AUTOTRACE_PIXELS) {
      throw new BadRequestException(`image: at most ${MAX_AUTOTRACE_PIXELS / 1e6} megapixels; send a smaller photo`);
    }
    let pixels: { data: Uint8Array; width: number; height: number };
    try {
      if (sniffed.contentType === 'image/png') {
        const png = PNG.sync.read(body);
        pixels = { data: png.data, width: png.width, height: png.height };
      } else {
        const img = jpeg.decode(body, { useTArray: true, formatAsRGBA: true, maxMemoryUsageInMB: 512 });
        pixels = { data: img.data, width: img.width, height: img.height };
      }
    } catch {
      throw new BadRequestException('image: the picture could not be decoded (a damaged or cut-short file)');
    }
    const result = autotraceCard(pixels, { lengthIn: q.lengthIn, springPsiPerIn: q.springPsiPerIn });
    const messages = result.proposal.reasons.map((r) => r.message);
    if (!result.trace || result.areaSqIn == null || result.meanEffectivePressurePsi == null) {
      throw new UnprocessableEntityException({
        statusCode: 422,
        error: 'Unprocessable Entity',
        message: `No single closed diagram was found: ${messages.join(' ')}`,
        reasons: result.proposal.reasons,
      });
    }
    return {
      trace: result.trace,
      areaIn2: result.areaSqIn,
      meanEffectivePressurePsi: result.meanEffectivePressurePsi,
      confidence: result.proposal.confidence,
      warnings: messages,
    };
  }
}
