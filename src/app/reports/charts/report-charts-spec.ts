import type { ReportDto } from '../../../../shared/report';
import { num, record } from '../record-read';
import type { DiffusionUnit, FrequencyUnit } from '../report-units';
import type { ChartOption } from './chart-option';
import { energyChart, pressureChart, totalEnergyChart } from './energy-charts';
import { lindemannChart, ngpChart } from './melting-charts';
import { msdChart } from './msd-chart';
import { RDF_CHART_HEIGHT, rdfChart } from './rdf-chart';
import { sqChart } from './sq-chart';
import { timeSeriesChart } from './thermo-chart';
import { vacfChart } from './vacf-chart';
import { vdosChart } from './vdos-chart';

/** One chart of a report: what it shows, which curve its CSV is, and its options. */
export interface ChartSpec {
  id: string;
  title: string;
  /** The curve behind it, for the CSV download. */
  curve: string;
  /** Read aloud in place of the picture. */
  description: string;
  option: ChartOption;
  /** Pixel height of the plot, when it needs more than the usual. */
  height?: number;
}

export interface ChartUnits {
  diffusion: DiffusionUnit;
  frequency: FrequencyUnit;
}

/** The report's charts in reading order; a curve the report lacks has no chart. */
export function reportChartSpecs(report: ReportDto, units: ChartUnits): ChartSpec[] {
  const { curves, summary } = report;
  const out: ChartSpec[] = [];
  const add = (id: string, curve: string, title: string, description: string, build: () => ChartOption) => {
    if (curves[curve]) out.push({ id, title, curve, description, option: build() });
  };
  add('msd', 'msd', 'Mean-square displacement', 'MSD against lag time on log–log axes, with the fitted window shaded and a slope-1 guide line.',
    () => msdChart(curves['msd']!, summary.msd));
  add('vacf', 'vacf', 'Velocity autocorrelation and Green–Kubo integral', 'Normalised VACF against lag time, and the running Green–Kubo diffusion coefficient on a second axis.',
    () => vacfChart(curves['vacf']!, summary.vacf, units.diffusion));
  add('vdos', 'vdos', 'Vibrational density of states', 'VDOS against frequency with its peaks marked.',
    () => vdosChart(curves['vdos']!, summary.vdos, units.frequency));
  add('rdf', 'rdf', 'Radial distribution function', 'g(r) against distance, and the running coordination number in a panel of its own below.',
    () => rdfChart(curves['rdf']!, summary.rdf));
  const rdf = out.find((s) => s.id === 'rdf');
  if (rdf) rdf.height = RDF_CHART_HEIGHT;
  add('temperature', 'thermo', 'Temperature', 'Instantaneous temperature against time, with the mean and its standard error band.',
    () => timeSeriesChart(curves['thermo']!, 'temperature', 'temperature', 'K', summary.thermo?.temperatureK));
  if (curves['thermo']?.columns.includes('density')) {
    add('density', 'thermo', 'Density', 'Mass density against time, with the mean and its standard error band.',
      () => timeSeriesChart(curves['thermo']!, 'density', 'density', 'g/cm³', summary.thermo?.densityGPerCm3));
  }
  add('sq', 'sq', 'Structure factor', 'S(q) against wavevector, the unreliable low-q range shaded.',
    () => sqChart(curves['sq']!, num(record(report.methods, 'sq'), 'qReliableFromInvA')));
  add('ngp', 'ngp', 'Non-Gaussian parameter', 'α₂ against lag time on a log axis, its peak marked.', () => ngpChart(curves['ngp']!, summary.ngp));
  add('lindemann', 'lindemann', 'Lindemann index per atom', 'Each atom’s Lindemann index, with the melting threshold.',
    () => lindemannChart(curves['lindemann']!, summary.lindemann));
  add('energy', 'energy', 'Potential and kinetic energy', 'Potential energy per atom (and the file’s, when it has one) and kinetic energy per atom against time.',
    () => energyChart(curves['energy']!));
  if (curves['energy']?.columns.includes('total energy')) {
    add('total-energy', 'energy', 'Total energy and drift', 'Total energy per atom against time on its own scale, with the fitted drift line.',
      () => totalEnergyChart(curves['energy']!, summary.energy));
  }
  if (curves['energy']?.columns.includes('pressure')) {
    add('pressure', 'energy', 'Pressure', 'Pressure against time with its mean and standard error band, and the diagonal components of the pressure tensor.',
      () => pressureChart(curves['energy']!, summary.energy));
  }
  return out;
}
