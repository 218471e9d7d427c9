import { redirect } from 'next/navigation';
import { getAuthContext } from '@/lib/auth/context';

export default async function Home() {
  const ctx = await getAuthContext();
  redirect(ctx?.organization ? '/dashboard' : '/sign-in');
}
