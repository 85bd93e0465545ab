// The icons the workbench shows, and only those: each an SVG file of the Material Symbols set (outlined,
// weight 400) from the `@material-symbols/svg-400` npm package, inlined at build time as text (the `.svg`
// loader in angular.json) and registered by name with Material's icon registry. A template names one as
// `<mat-icon svgIcon="add" />`; an icon not listed here shows nothing and logs an error, and the spec
// beside this file finds any name in a template that is missing here.
//
// To add an icon: import its file below in alphabetical order and add it to APP_ICONS.
import { type EnvironmentProviders, inject, provideEnvironmentInitializer } from '@angular/core';
import { MatIconRegistry } from '@angular/material/icon';
import { DomSanitizer } from '@angular/platform-browser';
import accountCircleSvg from '@material-symbols/svg-400/outlined/account_circle.svg';
import addSvg from '@material-symbols/svg-400/outlined/add.svg';
import addAPhotoSvg from '@material-symbols/svg-400/outlined/add_a_photo.svg';
import addCircleSvg from '@material-symbols/svg-400/outlined/add_circle.svg';
import adjustSvg from '@material-symbols/svg-400/outlined/adjust.svg';
import agricultureSvg from '@material-symbols/svg-400/outlined/agriculture.svg';
import apiSvg from '@material-symbols/svg-400/outlined/api.svg';
import archiveSvg from '@material-symbols/svg-400/outlined/archive.svg';
import arrowBackSvg from '@material-symbols/svg-400/outlined/arrow_back.svg';
import arrowForwardSvg from '@material-symbols/svg-400/outlined/arrow_forward.svg';
import assignmentSvg from '@material-symbols/svg-400/outlined/assignment.svg';
import attachFileSvg from '@material-symbols/svg-400/outlined/attach_file.svg';
import backspaceSvg from '@material-symbols/svg-400/outlined/backspace.svg';
import badgeSvg from '@material-symbols/svg-400/outlined/badge.svg';
import blockSvg from '@material-symbols/svg-400/outlined/block.svg';
import brokenImageSvg from '@material-symbols/svg-400/outlined/broken_image.svg';
import buildSvg from '@material-symbols/svg-400/outlined/build.svg';
import calculateSvg from '@material-symbols/svg-400/outlined/calculate.svg';
import cancelSvg from '@material-symbols/svg-400/outlined/cancel.svg';
import categorySvg from '@material-symbols/svg-400/outlined/category.svg';
import checkSvg from '@material-symbols/svg-400/outlined/check.svg';
import checkCircleSvg from '@material-symbols/svg-400/outlined/check_circle.svg';
import closeSvg from '@material-symbols/svg-400/outlined/close.svg';
import cloudDoneSvg from '@material-symbols/svg-400/outlined/cloud_done.svg';
import cloudOffSvg from '@material-symbols/svg-400/outlined/cloud_off.svg';
import contentCopySvg from '@material-symbols/svg-400/outlined/content_copy.svg';
import contrastSvg from '@material-symbols/svg-400/outlined/contrast.svg';
import deleteSvg from '@material-symbols/svg-400/outlined/delete.svg';
import descriptionSvg from '@material-symbols/svg-400/outlined/description.svg';
import downloadSvg from '@material-symbols/svg-400/outlined/download.svg';
import drawSvg from '@material-symbols/svg-400/outlined/draw.svg';
import editSvg from '@material-symbols/svg-400/outlined/edit.svg';
import editNoteSvg from '@material-symbols/svg-400/outlined/edit_note.svg';
import errorSvg from '@material-symbols/svg-400/outlined/error.svg';
import factCheckSvg from '@material-symbols/svg-400/outlined/fact_check.svg';
import firstPageSvg from '@material-symbols/svg-400/outlined/first_page.svg';
import forwardSvg from '@material-symbols/svg-400/outlined/forward.svg';
import gavelSvg from '@material-symbols/svg-400/outlined/gavel.svg';
import groupSvg from '@material-symbols/svg-400/outlined/group.svg';
import healthAndSafetySvg from '@material-symbols/svg-400/outlined/health_and_safety.svg';
import hideImageSvg from '@material-symbols/svg-400/outlined/hide_image.svg';
import historySvg from '@material-symbols/svg-400/outlined/history.svg';
import homeSvg from '@material-symbols/svg-400/outlined/home.svg';
import inboxSvg from '@material-symbols/svg-400/outlined/inbox.svg';
import infoSvg from '@material-symbols/svg-400/outlined/info.svg';
import inventory2Svg from '@material-symbols/svg-400/outlined/inventory_2.svg';
import keySvg from '@material-symbols/svg-400/outlined/key.svg';
import keyOffSvg from '@material-symbols/svg-400/outlined/key_off.svg';
import lastPageSvg from '@material-symbols/svg-400/outlined/last_page.svg';
import linkOffSvg from '@material-symbols/svg-400/outlined/link_off.svg';
import lockSvg from '@material-symbols/svg-400/outlined/lock.svg';
import lockPersonSvg from '@material-symbols/svg-400/outlined/lock_person.svg';
import loginSvg from '@material-symbols/svg-400/outlined/login.svg';
import logoutSvg from '@material-symbols/svg-400/outlined/logout.svg';
import manageAccountsSvg from '@material-symbols/svg-400/outlined/manage_accounts.svg';
import markEmailReadSvg from '@material-symbols/svg-400/outlined/mark_email_read.svg';
import menuSvg from '@material-symbols/svg-400/outlined/menu.svg';
import moreVertSvg from '@material-symbols/svg-400/outlined/more_vert.svg';
import myLocationSvg from '@material-symbols/svg-400/outlined/my_location.svg';
import outboxSvg from '@material-symbols/svg-400/outlined/outbox.svg';
import panToolSvg from '@material-symbols/svg-400/outlined/pan_tool.svg';
import passwordSvg from '@material-symbols/svg-400/outlined/password.svg';
import pauseCircleSvg from '@material-symbols/svg-400/outlined/pause_circle.svg';
import pendingSvg from '@material-symbols/svg-400/outlined/pending.svg';
import personAddSvg from '@material-symbols/svg-400/outlined/person_add.svg';
import personCheckSvg from '@material-symbols/svg-400/outlined/person_check.svg';
import personEditSvg from '@material-symbols/svg-400/outlined/person_edit.svg';
import personOffSvg from '@material-symbols/svg-400/outlined/person_off.svg';
import pictureAsPdfSvg from '@material-symbols/svg-400/outlined/picture_as_pdf.svg';
import playArrowSvg from '@material-symbols/svg-400/outlined/play_arrow.svg';
import playlistAddSvg from '@material-symbols/svg-400/outlined/playlist_add.svg';
import precisionManufacturingSvg from '@material-symbols/svg-400/outlined/precision_manufacturing.svg';
import publishedWithChangesSvg from '@material-symbols/svg-400/outlined/published_with_changes.svg';
import radioButtonCheckedSvg from '@material-symbols/svg-400/outlined/radio_button_checked.svg';
import radioButtonUncheckedSvg from '@material-symbols/svg-400/outlined/radio_button_unchecked.svg';
import refreshSvg from '@material-symbols/svg-400/outlined/refresh.svg';
import replaySvg from '@material-symbols/svg-400/outlined/replay.svg';
import reportSvg from '@material-symbols/svg-400/outlined/report.svg';
import restartAltSvg from '@material-symbols/svg-400/outlined/restart_alt.svg';
import rotateLeftSvg from '@material-symbols/svg-400/outlined/rotate_left.svg';
import rotateRightSvg from '@material-symbols/svg-400/outlined/rotate_right.svg';
import saveSvg from '@material-symbols/svg-400/outlined/save.svg';
import scheduleSvg from '@material-symbols/svg-400/outlined/schedule.svg';
import searchSvg from '@material-symbols/svg-400/outlined/search.svg';
import searchOffSvg from '@material-symbols/svg-400/outlined/search_off.svg';
import sendSvg from '@material-symbols/svg-400/outlined/send.svg';
import sensorsSvg from '@material-symbols/svg-400/outlined/sensors.svg';
import showChartSvg from '@material-symbols/svg-400/outlined/show_chart.svg';
import speedSvg from '@material-symbols/svg-400/outlined/speed.svg';
import storefrontSvg from '@material-symbols/svg-400/outlined/storefront.svg';
import supervisorAccountSvg from '@material-symbols/svg-400/outlined/supervisor_account.svg';
import swapHorizSvg from '@material-symbols/svg-400/outlined/swap_horiz.svg';
import syncProblemSvg from '@material-symbols/svg-400/outlined/sync_problem.svg';
import taskAltSvg from '@material-symbols/svg-400/outlined/task_alt.svg';
import timelineSvg from '@material-symbols/svg-400/outlined/timeline.svg';
import touchAppSvg from '@material-symbols/svg-400/outlined/touch_app.svg';
import unarchiveSvg from '@material-symbols/svg-400/outlined/unarchive.svg';
import uploadFileSvg from '@material-symbols/svg-400/outlined/upload_file.svg';
import verifiedSvg from '@material-symbols/svg-400/outlined/verified.svg';
import verifiedUserSvg from '@material-symbols/svg-400/outlined/verified_user.svg';
import visibilitySvg from '@material-symbols/svg-400/outlined/visibility.svg';
import visibilityOffSvg from '@material-symbols/svg-400/outlined/visibility_off.svg';
import warningSvg from '@material-symbols/svg-400/outlined/warning.svg';
import widgetsSvg from '@material-symbols/svg-400/outlined/widgets.svg';

/** Every icon of the workbench, by the name templates give it. */
export const APP_ICONS = {
  account_circle: accountCircleSvg,
  add: addSvg,
  add_a_photo: addAPhotoSvg,
  add_circle: addCircleSvg,
  adjust: adjustSvg,
  agriculture: agricultureSvg,
  api: apiSvg,
  archive: archiveSvg,
  arrow_back: arrowBackSvg,
  arrow_forward: arrowForwardSvg,
  assignment: assignmentSvg,
  attach_file: attachFileSvg,
  backspace: backspaceSvg,
  badge: badgeSvg,
  block: blockSvg,
  broken_image: brokenImageSvg,
  build: buildSvg,
  calculate: calculateSvg,
  cancel: cancelSvg,
  category: categorySvg,
  check: checkSvg,
  check_circle: checkCircleSvg,
  close: closeSvg,
  cloud_done: cloudDoneSvg,
  cloud_off: cloudOffSvg,
  content_copy: contentCopySvg,
  contrast: contrastSvg,
  delete: deleteSvg,
  description: descriptionSvg,
  download: downloadSvg,
  draw: drawSvg,
  edit: editSvg,
  edit_note: editNoteSvg,
  error: errorSvg,
  fact_check: factCheckSvg,
  first_page: firstPageSvg,
  forward: forwardSvg,
  gavel: gavelSvg,
  group: groupSvg,
  health_and_safety: healthAndSafetySvg,
  hide_image: hideImageSvg,
  history: historySvg,
  home: homeSvg,
  inbox: inboxSvg,
  info: infoSvg,
  inventory_2: inventory2Svg,
  key: keySvg,
  key_off: keyOffSvg,
  last_page: lastPageSvg,
  link_off: linkOffSvg,
  lock: lockSvg,
  lock_person: lockPersonSvg,
  login: loginSvg,
  logout: logoutSvg,
  manage_accounts: manageAccountsSvg,
  mark_email_read: markEmailReadSvg,
  menu: menuSvg,
  more_vert: moreVertSvg,
  my_location: myLocationSvg,
  outbox: outboxSvg,
  pan_tool: panToolSvg,
  password: passwordSvg,
  pause_circle: pauseCircleSvg,
  pending: pendingSvg,
  person_add: personAddSvg,
  person_check: personCheckSvg,
  person_edit: personEditSvg,
  person_off: personOffSvg,
  picture_as_pdf: pictureAsPdfSvg,
  play_arrow: playArrowSvg,
  playlist_add: playlistAddSvg,
  precision_manufacturing: precisionManufacturingSvg,
  published_with_changes: publishedWithChangesSvg,
  radio_button_checked: radioButtonCheckedSvg,
  radio_button_unchecked: radioButtonUncheckedSvg,
  refresh: refreshSvg,
  replay: replaySvg,
  report: reportSvg,
  restart_alt: restartAltSvg,
  rotate_left: rotateLeftSvg,
  rotate_right: rotateRightSvg,
  save: saveSvg,
  schedule: scheduleSvg,
  search: searchSvg,
  search_off: searchOffSvg,
  send: sendSvg,
  sensors: sensorsSvg,
  show_chart: showChartSvg,
  speed: speedSvg,
  storefront: storefrontSvg,
  supervisor_account: supervisorAccountSvg,
  swap_horiz: swapHorizSvg,
  sync_problem: syncProblemSvg,
  task_alt: taskAltSvg,
  timeline: timelineSvg,
  touch_app: touchAppSvg,
  unarchive: unarchiveSvg,
  upload_file: uploadFileSvg,
  verified: verifiedSvg,
  verified_user: verifiedUserSvg,
  visibility: visibilitySvg,
  visibility_off: visibilityOffSvg,
  warning: warningSvg,
  widgets: widgetsSvg,
} as const satisfies Readonly<Record<string, string>>;

/** The name of an icon the workbench has. */
export type AppIconName = keyof typeof APP_ICONS;

/**
 * Registers the workbench's icons with Material's icon registry. The SVG text is our own build's,
 * never user input, so it is trusted as HTML.
 */
export function provideAppIcons(): EnvironmentProviders {
  return provideEnvironmentInitializer(() => {
    const registry = inject(MatIconRegistry);
    const sanitizer = inject(DomSanitizer);
    for (const [name, svg] of Object.entries(APP_ICONS)) {
      registry.addSvgIconLiteral(name, sanitizer.bypassSecurityTrustHtml(svg));
    }
  });
}
