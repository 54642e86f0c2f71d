/**
 * Longtail's look for react-jsonschema-form: the templates and widgets above, to spread into
 * <Form templates widgets>. `quantity` is the engineering-notation widget for fields with a unit.
 */
import type { RegistryWidgetsType, TemplatesType } from '@rjsf/utils';
import { ArrayFieldTemplate } from './array-field-template';
import { BaseInputTemplate } from './base-input-template';
import { CheckboxesWidget, CheckboxWidget, FixedWidget, RadioWidget, SelectWidget } from './choice-widgets';
import { DescriptionFieldTemplate, FieldErrorTemplate, FieldHelpTemplate, TitleFieldTemplate } from './field-messages';
import { FieldTemplate } from './field-template';
import { ObjectFieldTemplate } from './object-field-template';
import { QuantityWidget } from './quantity-widget';
import { SubmitButton } from './submit-button';

export const FORM_TEMPLATES: Partial<Omit<TemplatesType, 'ButtonTemplates'>> & { ButtonTemplates: Partial<TemplatesType['ButtonTemplates']> } = {
  ArrayFieldTemplate,
  BaseInputTemplate,
  DescriptionFieldTemplate,
  FieldErrorTemplate,
  FieldHelpTemplate,
  FieldTemplate,
  ObjectFieldTemplate,
  TitleFieldTemplate,
  ButtonTemplates: { SubmitButton },
};

export const FORM_WIDGETS: RegistryWidgetsType = {
  quantity: QuantityWidget,
  fixed: FixedWidget,
  SelectWidget,
  RadioWidget,
  CheckboxWidget,
  CheckboxesWidget,
};
