import 'server-only';
import { notFound, redirect } from 'next/navigation';
import { cache } from 'react';
import { getPlan, type Plan } from '../data/plans';
import { getStudy, type StudyDetail } from '../data/studies';
import { HttpError } from '../http/errors';
import { getSessionUser } from './session';
import type { SessionUser } from './session-user';

/**
 * A study page's study for the signed-in viewer: sign-in redirect when nobody is signed in, notFound()
 * when the study does not exist or they are not on it (the same answer, so a study's existence is not
 * disclosed). Cached per request so a page's metadata and body share one query.
 */
export const loadStudyPage = cache(async (rawId: string): Promise<{ study: StudyDetail; user: SessionUser }> => {
  const user = await getSessionUser();
  if (!user) redirect('/signin');
  if (!/^[1-9][0-9]{0,9}$/.test(rawId)) notFound();
  let study: StudyDetail;
  try {
    study = await getStudy(user, Number(rawId));
  } catch (error) {
    if (error instanceof HttpError && error.status === 404) notFound();
    throw error;
  }
  return { study, user };
});

/**
 * A plan page's study and plan for the signed-in viewer: like loadStudyPage, plus notFound() for a plan
 * id that is malformed or not on this study, so a plan page is the app's real 404 before its data loads.
 */
export async function loadPlanPage(rawStudyId: string, rawPlanId: string): Promise<{ study: StudyDetail; user: SessionUser; plan: Plan }> {
  const { study, user } = await loadStudyPage(rawStudyId);
  if (!/^[1-9][0-9]{0,9}$/.test(rawPlanId)) notFound();
  try {
    return { study, user, plan: await getPlan(user, study.id, Number(rawPlanId)) };
  } catch (error) {
    if (error instanceof HttpError && error.status === 404) notFound();
    throw error;
  }
}
