export { Button } from './Button';
export { Form, type FormProps } from './Form';
export { TextField } from './TextField';
