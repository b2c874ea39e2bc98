import type { RouteChart } from "../../sheets/grid.js";
import { blockA1, cellA1 } from "./rangeAddress.js";

/** Chart size in points: about 8 default columns by 24 rows. */
const CHART_WIDTH_PT = 480;
const CHART_HEIGHT_PT = 360;

/**
 * Queues an XY scatter-with-lines chart of the routes: one series per vehicle, x = the
 * longitude cells and y = the latitude cells of its rows, so the lines follow visiting order.
 * Series take ranges, not arrays (ExcelApi 1.7, OFFICE-NOTES.md): the cells must be written
 * in the same batch before this is queued. `charts.add` needs source data, which creates one
 * series from the first vehicle's latitude column; that series is reused for the first
 * vehicle (name and both ranges set explicitly) and `series.add(name)` adds the others.
 *
 * @param sheet - the worksheet holding the route table
 * @param chart - title, series blocks and anchor from the layout
 * @returns nothing; the caller syncs
 * @throws RangeError when `chart.series` is empty (a chart with no route is a caller mistake)
 * @example queueRouteChart(sheet, layout.chart); await context.sync();
 */
export function queueRouteChart(sheet: Excel.Worksheet, chart: RouteChart): void {
  const [first, ...rest] = chart.series;
  if (!first) throw new RangeError("chart.series must hold at least one route");
  const made = sheet.charts.add(Excel.ChartType.xyscatterLines, sheet.getRange(blockA1(first.y)), Excel.ChartSeriesBy.columns);
  made.title.text = chart.title;
  made.setPosition(cellA1(chart.anchor.row, chart.anchor.col));
  made.width = CHART_WIDTH_PT;
  made.height = CHART_HEIGHT_PT;
  const firstSeries = made.series.getItemAt(0);
  firstSeries.name = first.name;
  firstSeries.setXAxisValues(sheet.getRange(blockA1(first.x)));
  firstSeries.setValues(sheet.getRange(blockA1(first.y)));
  for (const s of rest) {
    const series = made.series.add(s.name);
    series.setXAxisValues(sheet.getRange(blockA1(s.x)));
    series.setValues(sheet.getRange(blockA1(s.y)));
  }
}
