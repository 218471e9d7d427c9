export { initialFormState, type FormState } from '@/lib/contracts/forms';
