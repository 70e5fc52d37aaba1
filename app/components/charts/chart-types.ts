export type PointShape = "within" | "guard" | "out" | "excluded";

export interface ChartPoint {
  id: number;
  at: Date;
  value: number;
  shape: PointShape;
  signal: boolean;
  /** Lines shown in the tooltip: date, value, outcome, and each signal in words. */
  tooltip: string[];
}

export interface ChartStage {
  from: Date;
  to: Date;
  center: number | null;
  warning: [number, number] | null;
  control: [number, number] | null;
  baselineEnd: Date | null;
}

export interface ChartLine {
  at: Date;
  value: number;
}

export interface TrendSample {
  at: Date;
  fit: number;
  low: number;
  high: number;
}

export interface ChartEvent {
  at: Date;
  label: string;
}
