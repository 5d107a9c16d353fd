import { ApiProperty, ApiPropertyOptional } from '@nestjs/swagger';
import { Type } from 'class-transformer';
import {
  ArrayMaxSize,
  ArrayMinSize,
  IsArray,
  IsBoolean,
  IsIn,
  IsOptional,
  IsString,
  IsUUID,
  Matches,
  MaxLength,
  MinLength,
  ValidateNested,
} from 'class-validator';
import {
  CHECKLIST_ITEM_KINDS,
  CHECKLIST_PURPOSES,
  CHECKLIST_REQUIRED_WHEN,
  DUTIES,
  HAZARDS,
  type ChecklistItemDef,
  type ChecklistItemKind,
  type ChecklistPurpose,
  type ChecklistRequiredWhen,
  type ChecklistSectionDef,
  type ChecklistTemplateContent,
  type CreateChecklistTemplateRequest,
  type Duty,
  type Hazard,
  type ItemCaution,
  type IssueChecklistTemplateRequest,
} from '@crankjournal/shared-types';
import { IsFiniteNumberIn } from '../../../common/dto/validators.js';
import { KEY_PATTERN } from '../checklist-rules.js';

const oneOf = (list: readonly string[]) => ({
  message: ({ property }: { property: string }) => `${property} must be one of: ${list.join(', ')}`,
});
const keyRule = { message: ({ property }: { property: string }) => `${property} must be 1–64 letters, digits, - or _` };

export class ItemCautionDto implements ItemCaution {
  @ApiProperty({ enum: HAZARDS }) @IsIn(HAZARDS, oneOf(HAZARDS)) hazard: Hazard;
  @ApiProperty() @IsString() @MinLength(3, { message: 'caution.text must say what to beware of' }) @MaxLength(600) text: string;
}

export class ChecklistItemDefDto implements ChecklistItemDef {
  @ApiProperty() @IsString() @Matches(KEY_PATTERN, keyRule) key: string;
  @ApiProperty({ enum: CHECKLIST_ITEM_KINDS }) @IsIn(CHECKLIST_ITEM_KINDS, oneOf(CHECKLIST_ITEM_KINDS)) kind: ChecklistItemKind;
  @ApiProperty() @IsString() @MinLength(1, { message: 'label must not be empty' }) @MaxLength(200) label: string;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(600) help?: string;
  @ApiProperty() @IsBoolean({ message: 'required must be true or false' }) required: boolean;
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(16) unit?: string;
  @ApiPropertyOptional() @IsOptional() @IsFiniteNumberIn(-1e6, 1e6) min?: number | null;
  @ApiPropertyOptional() @IsOptional() @IsFiniteNumberIn(-1e6, 1e6) max?: number | null;
  @ApiPropertyOptional()
  @IsOptional()
  @IsArray()
  @ArrayMaxSize(12)
  @IsString({ each: true })
  @MinLength(1, { each: true })
  @MaxLength(200, { each: true })
  choices?: string[];
  @ApiPropertyOptional() @IsOptional() @IsArray() @ArrayMaxSize(12) @IsString({ each: true }) acceptable?: string[];
  @ApiPropertyOptional({ type: ItemCautionDto })
  @IsOptional()
  @ValidateNested()
  @Type(() => ItemCautionDto)
  caution?: ItemCautionDto | null;
}

export class ChecklistSectionDefDto implements ChecklistSectionDef {
  @ApiProperty() @IsString() @Matches(KEY_PATTERN, keyRule) key: string;
  @ApiProperty() @IsString() @MinLength(1, { message: 'title must not be empty' }) @MaxLength(120) title: string;
  @ApiProperty({ type: [ChecklistItemDefDto] })
  @IsArray()
  @ArrayMinSize(1, { message: 'a section needs at least one item' })
  @ArrayMaxSize(80)
  @ValidateNested({ each: true })
  @Type(() => ChecklistItemDefDto)
  items: ChecklistItemDefDto[];
}

export class ChecklistTemplateContentDto implements ChecklistTemplateContent {
  @ApiProperty() @IsString() @MinLength(1, { message: 'name must not be empty' }) @MaxLength(120) name: string;
  @ApiProperty({ enum: CHECKLIST_PURPOSES }) @IsIn(CHECKLIST_PURPOSES, oneOf(CHECKLIST_PURPOSES)) purpose: ChecklistPurpose;
  @ApiProperty({ enum: CHECKLIST_REQUIRED_WHEN })
  @IsIn(CHECKLIST_REQUIRED_WHEN, oneOf(CHECKLIST_REQUIRED_WHEN))
  requiredWhen: ChecklistRequiredWhen;
  @ApiProperty({ enum: DUTIES }) @IsIn(DUTIES, oneOf(DUTIES)) requiredDuty: Duty;
  @ApiProperty() @IsString() @MaxLength(4000) description: string;
  @ApiProperty({ type: [ChecklistSectionDefDto] })
  @IsArray()
  @ArrayMinSize(1, { message: 'a checklist needs at least one section' })
  @ArrayMaxSize(30)
  @ValidateNested({ each: true })
  @Type(() => ChecklistSectionDefDto)
  sections: ChecklistSectionDefDto[];
}

export class CreateChecklistTemplateDto extends ChecklistTemplateContentDto implements CreateChecklistTemplateRequest {
  @ApiProperty() @IsUUID('all', { message: 'engineId must be a UUID' }) engineId: string;
  @ApiPropertyOptional() @IsOptional() @IsBoolean({ message: 'issue must be true or false' }) issue?: boolean;
}

export class IssueChecklistTemplateDto implements IssueChecklistTemplateRequest {
  @ApiPropertyOptional() @IsOptional() @IsString() @MaxLength(1000) changeNote?: string;
}

export class TemplateQueryDto {
  @ApiPropertyOptional({ format: 'uuid', description: 'Only the templates of this engine' })
  @IsOptional()
  @IsUUID('all', { message: 'engineId must be a UUID' })
  engineId?: string;
}

export class TemplateVersionParamDto {
  @IsUUID('all', { message: 'id must be a UUID' }) id: string;
  @Type(() => Number)
  @IsFiniteNumberIn(1, 100000)
  version: number;
}
