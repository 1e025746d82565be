/** My e-mail switches (the in-app notices always appear). */
import { MAIL_PREFERENCE_LABELS, type MailPreferencesDto } from '@shared/reviews';
import { Notice } from '@/components/Notice';
import { useMailPreferences } from '../api/mail-preferences';
import { useSaveMailPreferences } from '../api/save-mail-preferences';

const KEYS = Object.keys(MAIL_PREFERENCE_LABELS) as (keyof MailPreferencesDto)[];

export function MailPreferencesPanel() {
  const prefs = useMailPreferences();
  const save = useSaveMailPreferences();
  if (!prefs.data) return null;
  const current = prefs.data;
  return (
    <section id="mail" aria-labelledby="mail-heading" className="rounded-lg border border-slate-200 bg-white p-4 dark:border-slate-800 dark:bg-slate-900">
      <h2 id="mail-heading" className="text-base font-bold">
        E-mail me when
      </h2>
      <ul className="mt-2 space-y-1 text-sm">
        {KEYS.map((key) => (
          <li key={key}>
            <label className="flex items-center gap-2">
              <input type="checkbox" checked={current[key]} disabled={save.isPending} onChange={(e) => save.mutate({ ...current, [key]: e.target.checked })} />
              {MAIL_PREFERENCE_LABELS[key]}
            </label>
          </li>
        ))}
      </ul>
      <p className="mt-2 text-xs text-slate-500">These apply in every workspace. Notices in the app always appear.</p>
      {save.error && <Notice tone="error">{save.error.message}</Notice>}
    </section>
  );
}
