/** Display formats for the models pages (dates: the shared format). */
export { formatWhen } from '@/lib/dates';
