// The workbench's icons that its first page does not show (see app-icons.ts): a chunk of their own, which
// the icon registry imports the first time a page names one of them.
//
// To add an icon: import its file below in alphabetical order and add it to LATER_ICONS.
import addSvg from '@material-symbols/svg-400/outlined/add.svg';
import addAPhotoSvg from '@material-symbols/svg-400/outlined/add_a_photo.svg';
import addCircleSvg from '@material-symbols/svg-400/outlined/add_circle.svg';
import adjustSvg from '@material-symbols/svg-400/outlined/adjust.svg';
import archiveSvg from '@material-symbols/svg-400/outlined/archive.svg';
import arrowBackSvg from '@material-symbols/svg-400/outlined/arrow_back.svg';
import arrowForwardSvg from '@material-symbols/svg-400/outlined/arrow_forward.svg';
import attachFileSvg from '@material-symbols/svg-400/outlined/attach_file.svg';
import backspaceSvg from '@material-symbols/svg-400/outlined/backspace.svg';
import blockSvg from '@material-symbols/svg-400/outlined/block.svg';
import brokenImageSvg from '@material-symbols/svg-400/outlined/broken_image.svg';
import buildSvg from '@material-symbols/svg-400/outlined/build.svg';
import calculateSvg from '@material-symbols/svg-400/outlined/calculate.svg';
import cancelSvg from '@material-symbols/svg-400/outlined/cancel.svg';
import checkSvg from '@material-symbols/svg-400/outlined/check.svg';
import checkCircleSvg from '@material-symbols/svg-400/outlined/check_circle.svg';
import closeSvg from '@material-symbols/svg-400/outlined/close.svg';
import contentCopySvg from '@material-symbols/svg-400/outlined/content_copy.svg';
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
import hideImageSvg from '@material-symbols/svg-400/outlined/hide_image.svg';
import historySvg from '@material-symbols/svg-400/outlined/history.svg';
import inboxSvg from '@material-symbols/svg-400/outlined/inbox.svg';
import infoSvg from '@material-symbols/svg-400/outlined/info.svg';
import inventory2Svg from '@material-symbols/svg-400/outlined/inventory_2.svg';
import keyOffSvg from '@material-symbols/svg-400/outlined/key_off.svg';
import lastPageSvg from '@material-symbols/svg-400/outlined/last_page.svg';
import linkOffSvg from '@material-symbols/svg-400/outlined/link_off.svg';
import lockSvg from '@material-symbols/svg-400/outlined/lock.svg';
import lockPersonSvg from '@material-symbols/svg-400/outlined/lock_person.svg';
import manageAccountsSvg from '@material-symbols/svg-400/outlined/manage_accounts.svg';
import markEmailReadSvg from '@material-symbols/svg-400/outlined/mark_email_read.svg';
import moreVertSvg from '@material-symbols/svg-400/outlined/more_vert.svg';
import myLocationSvg from '@material-symbols/svg-400/outlined/my_location.svg';
import panToolSvg from '@material-symbols/svg-400/outlined/pan_tool.svg';
import passwordSvg from '@material-symbols/svg-400/outlined/password.svg';
import pauseCircleSvg from '@material-symbols/svg-400/outlined/pause_circle.svg';
import personAddSvg from '@material-symbols/svg-400/outlined/person_add.svg';
import personCheckSvg from '@material-symbols/svg-400/outlined/person_check.svg';
import personEditSvg from '@material-symbols/svg-400/outlined/person_edit.svg';
import personOffSvg from '@material-symbols/svg-400/outlined/person_off.svg';
import pictureAsPdfSvg from '@material-symbols/svg-400/outlined/picture_as_pdf.svg';
import playArrowSvg from '@material-symbols/svg-400/outlined/play_arrow.svg';
import playlistAddSvg from '@material-symbols/svg-400/outlined/playlist_add.svg';
import precisionManufacturingSvg from '@material-symbols/svg-400/outlined/precision_manufacturing.svg';
import publishedWithChangesSvg from '@material-symbols/svg-400/outlined/published_with_changes.svg';
import refreshSvg from '@material-symbols/svg-400/outlined/refresh.svg';
import replaySvg from '@material-symbols/svg-400/outlined/replay.svg';
import reportSvg from '@material-symbols/svg-400/outlined/report.svg';
import restartAltSvg from '@material-symbols/svg-400/outlined/restart_alt.svg';
import rotateLeftSvg from '@material-symbols/svg-400/outlined/rotate_left.svg';
import rotateRightSvg from '@material-symbols/svg-400/outlined/rotate_right.svg';
import saveSvg from '@material-symbols/svg-400/outlined/save.svg';
import searchSvg from '@material-symbols/svg-400/outlined/search.svg';
import searchOffSvg from '@material-symbols/svg-400/outlined/search_off.svg';
import sensorsSvg from '@material-symbols/svg-400/outlined/sensors.svg';
import showChartSvg from '@material-symbols/svg-400/outlined/show_chart.svg';
import speedSvg from '@material-symbols/svg-400/outlined/speed.svg';
import supervisorAccountSvg from '@material-symbols/svg-400/outlined/supervisor_account.svg';
import swapHorizSvg from '@material-symbols/svg-400/outlined/swap_horiz.svg';
import taskAltSvg from '@material-symbols/svg-400/outlined/task_alt.svg';
import timelineSvg from '@material-symbols/svg-400/outlined/timeline.svg';
import touchAppSvg from '@material-symbols/svg-400/outlined/touch_app.svg';
import unarchiveSvg from '@material-symbols/svg-400/outlined/unarchive.svg';
import uploadFileSvg from '@material-symbols/svg-400/outlined/upload_file.svg';
import verifiedSvg from '@material-symbols/svg-400/outlined/verified.svg';
import verifiedUserSvg from '@material-symbols/svg-400/outlined/verified_user.svg';
import warningSvg from '@material-symbols/svg-400/outlined/warning.svg';

/** Every icon of the workbench beyond the first load's, by the name templates give it. */
export const LATER_ICONS = {
  add: addSvg,
  add_a_photo: addAPhotoSvg,
  add_circle: addCircleSvg,
  adjust: adjustSvg,
  archive: archiveSvg,
  arrow_back: arrowBackSvg,
  arrow_forward: arrowForwardSvg,
  attach_file: attachFileSvg,
  backspace: backspaceSvg,
  block: blockSvg,
  broken_image: brokenImageSvg,
  build: buildSvg,
  calculate: calculateSvg,
  cancel: cancelSvg,
  check: checkSvg,
  check_circle: checkCircleSvg,
  close: closeSvg,
  content_copy: contentCopySvg,
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
  hide_image: hideImageSvg,
  history: historySvg,
  inbox: inboxSvg,
  info: infoSvg,
  inventory_2: inventory2Svg,
  key_off: keyOffSvg,
  last_page: lastPageSvg,
  link_off: linkOffSvg,
  lock: lockSvg,
  lock_person: lockPersonSvg,
  manage_accounts: manageAccountsSvg,
  mark_email_read: markEmailReadSvg,
  more_vert: moreVertSvg,
  my_location: myLocationSvg,
  pan_tool: panToolSvg,
  password: passwordSvg,
  pause_circle: pauseCircleSvg,
  person_add: personAddSvg,
  person_check: personCheckSvg,
  person_edit: personEditSvg,
  person_off: personOffSvg,
  picture_as_pdf: pictureAsPdfSvg,
  play_arrow: playArrowSvg,
  playlist_add: playlistAddSvg,
  precision_manufacturing: precisionManufacturingSvg,
  published_with_changes: publishedWithChangesSvg,
  refresh: refreshSvg,
  replay: replaySvg,
  report: reportSvg,
  restart_alt: restartAltSvg,
  rotate_left: rotateLeftSvg,
  rotate_right: rotateRightSvg,
  save: saveSvg,
  search: searchSvg,
  search_off: searchOffSvg,
  sensors: sensorsSvg,
  show_chart: showChartSvg,
  speed: speedSvg,
  supervisor_account: supervisorAccountSvg,
  swap_horiz: swapHorizSvg,
  task_alt: taskAltSvg,
  timeline: timelineSvg,
  touch_app: touchAppSvg,
  unarchive: unarchiveSvg,
  upload_file: uploadFileSvg,
  verified: verifiedSvg,
  verified_user: verifiedUserSvg,
  warning: warningSvg,
} as const satisfies Readonly<Record<string, string>>;
