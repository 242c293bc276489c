export { Button } from './Button';
export { Form, type FormProps } from './Form';
export { FormError } from './FormError';
export { FormField } from './FormField';
export { applyServerErrors } from './serverErrors';
export { TextField } from './TextField';
export { Choice } from './Choice';
export { ConfirmButton } from './ConfirmButton';
export { useApiForm } from './useApiForm';
