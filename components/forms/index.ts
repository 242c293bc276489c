export { Button } from './Button';
export { TextField } from './TextField';
