import { redirect } from 'next/navigation';
import { getCurrentMember } from '@/features/auth/guard';

export const dynamic = 'force-dynamic';

export default async function Home() {
  redirect((await getCurrentMember()) ? '/programs' : '/sign-in');
}
