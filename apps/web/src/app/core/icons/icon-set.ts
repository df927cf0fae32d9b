/**
 * The icons Loadwright shows, as SVG from Material Symbols (outlined, weight 400), bundled with the
 * app: only these few kilobytes travel, never the 4 MB icon font with every glyph. Each is
 * registered under its Material Symbols name; templates use `<mat-icon svgIcon="name">`. A name
 * used in a template or an `icon:` field must be listed here (icon-set.spec.ts checks).
 */
import { inject, provideAppInitializer, type EnvironmentProviders } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';
import boltSvg from '@material-symbols/svg-400/outlined/bolt.svg';
import cancelSvg from '@material-symbols/svg-400/outlined/cancel.svg';
import engineeringSvg from '@material-symbols/svg-400/outlined/engineering.svg';
import accountTreeSvg from '@material-symbols/svg-400/outlined/account_tree.svg';
import accountCircleSvg from '@material-symbols/svg-400/outlined/account_circle.svg';
import addSvg from '@material-symbols/svg-400/outlined/add.svg';
import archiveSvg from '@material-symbols/svg-400/outlined/archive.svg';
import arrowBackSvg from '@material-symbols/svg-400/outlined/arrow_back.svg';
import blockSvg from '@material-symbols/svg-400/outlined/block.svg';
import checkCircleSvg from '@material-symbols/svg-400/outlined/check_circle.svg';
import chevronLeftSvg from '@material-symbols/svg-400/outlined/chevron_left.svg';
import chevronRightSvg from '@material-symbols/svg-400/outlined/chevron_right.svg';
import closeSvg from '@material-symbols/svg-400/outlined/close.svg';
import cloudOffSvg from '@material-symbols/svg-400/outlined/cloud_off.svg';
import contentCopySvg from '@material-symbols/svg-400/outlined/content_copy.svg';
import conveyorBeltSvg from '@material-symbols/svg-400/outlined/conveyor_belt.svg';
import crisisAlertSvg from '@material-symbols/svg-400/outlined/crisis_alert.svg';
import databaseSvg from '@material-symbols/svg-400/outlined/database.svg';
import deleteSvg from '@material-symbols/svg-400/outlined/delete.svg';
import doneAllSvg from '@material-symbols/svg-400/outlined/done_all.svg';
import downloadSvg from '@material-symbols/svg-400/outlined/download.svg';
import editSvg from '@material-symbols/svg-400/outlined/edit.svg';
import errorSvg from '@material-symbols/svg-400/outlined/error.svg';
import factCheckSvg from '@material-symbols/svg-400/outlined/fact_check.svg';
import folderOpenSvg from '@material-symbols/svg-400/outlined/folder_open.svg';
import groupSvg from '@material-symbols/svg-400/outlined/group.svg';
import historySvg from '@material-symbols/svg-400/outlined/history.svg';
import hourglassEmptySvg from '@material-symbols/svg-400/outlined/hourglass_empty.svg';
import inboxSvg from '@material-symbols/svg-400/outlined/inbox.svg';
import infoSvg from '@material-symbols/svg-400/outlined/info.svg';
import keySvg from '@material-symbols/svg-400/outlined/key.svg';
import keyOffSvg from '@material-symbols/svg-400/outlined/key_off.svg';
import lightbulbSvg from '@material-symbols/svg-400/outlined/lightbulb.svg';
import linkOffSvg from '@material-symbols/svg-400/outlined/link_off.svg';
import logoutSvg from '@material-symbols/svg-400/outlined/logout.svg';
import markEmailReadSvg from '@material-symbols/svg-400/outlined/mark_email_read.svg';
import menuSvg from '@material-symbols/svg-400/outlined/menu.svg';
import modelTrainingSvg from '@material-symbols/svg-400/outlined/model_training.svg';
import outboxSvg from '@material-symbols/svg-400/outlined/outbox.svg';
import personAddSvg from '@material-symbols/svg-400/outlined/person_add.svg';
import playArrowSvg from '@material-symbols/svg-400/outlined/play_arrow.svg';
import policySvg from '@material-symbols/svg-400/outlined/policy.svg';
import progressActivitySvg from '@material-symbols/svg-400/outlined/progress_activity.svg';
import refreshSvg from '@material-symbols/svg-400/outlined/refresh.svg';
import ruleSvg from '@material-symbols/svg-400/outlined/rule.svg';
import scheduleSvg from '@material-symbols/svg-400/outlined/schedule.svg';
import scheduleSendSvg from '@material-symbols/svg-400/outlined/schedule_send.svg';
import searchSvg from '@material-symbols/svg-400/outlined/search.svg';
import searchOffSvg from '@material-symbols/svg-400/outlined/search_off.svg';
import spaceDashboardSvg from '@material-symbols/svg-400/outlined/space_dashboard.svg';
import stackedLineChartSvg from '@material-symbols/svg-400/outlined/stacked_line_chart.svg';
import syncSvg from '@material-symbols/svg-400/outlined/sync.svg';
import syncProblemSvg from '@material-symbols/svg-400/outlined/sync_problem.svg';
import timerOffSvg from '@material-symbols/svg-400/outlined/timer_off.svg';
import trendingUpSvg from '@material-symbols/svg-400/outlined/trending_up.svg';
import tuneSvg from '@material-symbols/svg-400/outlined/tune.svg';
import unarchiveSvg from '@material-symbols/svg-400/outlined/unarchive.svg';
import uploadFileSvg from '@material-symbols/svg-400/outlined/upload_file.svg';
import verifiedSvg from '@material-symbols/svg-400/outlined/verified.svg';
import visibilitySvg from '@material-symbols/svg-400/outlined/visibility.svg';
import visibilityOffSvg from '@material-symbols/svg-400/outlined/visibility_off.svg';
import warningSvg from '@material-symbols/svg-400/outlined/warning.svg';

/** Every icon by its Material Symbols name: the SVG text, inlined by the build (loader `.svg: text`). */
export const iconSet: Readonly<Record<string, string>> = {
  account_circle: accountCircleSvg,
  account_tree: accountTreeSvg,
  engineering: engineeringSvg,
  cancel: cancelSvg,
  bolt: boltSvg,
  add: addSvg,
  archive: archiveSvg,
  arrow_back: arrowBackSvg,
  block: blockSvg,
  check_circle: checkCircleSvg,
  chevron_left: chevronLeftSvg,
  chevron_right: chevronRightSvg,
  close: closeSvg,
  cloud_off: cloudOffSvg,
  content_copy: contentCopySvg,
  conveyor_belt: conveyorBeltSvg,
  crisis_alert: crisisAlertSvg,
  database: databaseSvg,
  delete: deleteSvg,
  done_all: doneAllSvg,
  download: downloadSvg,
  edit: editSvg,
  error: errorSvg,
  fact_check: factCheckSvg,
  folder_open: folderOpenSvg,
  group: groupSvg,
  history: historySvg,
  hourglass_empty: hourglassEmptySvg,
  inbox: inboxSvg,
  info: infoSvg,
  key: keySvg,
  key_off: keyOffSvg,
  lightbulb: lightbulbSvg,
  link_off: linkOffSvg,
  logout: logoutSvg,
  mark_email_read: markEmailReadSvg,
  menu: menuSvg,
  model_training: modelTrainingSvg,
  outbox: outboxSvg,
  person_add: personAddSvg,
  play_arrow: playArrowSvg,
  policy: policySvg,
  progress_activity: progressActivitySvg,
  refresh: refreshSvg,
  rule: ruleSvg,
  schedule: scheduleSvg,
  schedule_send: scheduleSendSvg,
  search: searchSvg,
  search_off: searchOffSvg,
  space_dashboard: spaceDashboardSvg,
  stacked_line_chart: stackedLineChartSvg,
  sync: syncSvg,
  sync_problem: syncProblemSvg,
  timer_off: timerOffSvg,
  trending_up: trendingUpSvg,
  tune: tuneSvg,
  unarchive: unarchiveSvg,
  upload_file: uploadFileSvg,
  verified: verifiedSvg,
  visibility: visibilitySvg,
  visibility_off: visibilityOffSvg,
  warning: warningSvg,
};

/** Registers the icon set with Angular Material's icon registry before the first screen renders. */
export function provideIcons(): EnvironmentProviders {
  return provideAppInitializer(() => {
    const registry = inject(MatIconRegistry);
    const sanitizer = inject(DomSanitizer);
    // The SVG is our own bundled text, not user input: trusting it as HTML is safe.
    for (const [name, svg] of Object.entries(iconSet)) registry.addSvgIconLiteral(name, sanitizer.bypassSecurityTrustHtml(svg));
  });
}
