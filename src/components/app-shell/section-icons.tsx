import Svg, { Circle, Path, Rect } from 'react-native-svg';

type IconProps = { color: string; size?: number };

/** Line icons drawn for Troughline's five sections (24 px grid, 2 px stroke). */
export function FormulasIcon({ color, size = 24 }: IconProps) {
  // A mixing trough seen from the end, with three heaps of ingredients.
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke={color} strokeWidth={2} strokeLinecap="round" strokeLinejoin="round">
      <Path d="M3 10h18l-2.5 9h-13z" />
      <Path d="M6 10c0-2 1.5-3 3-3s2 1.5 3 3M12 10c.5-2.5 2-4 3.5-4S18 8 18 10" />
    </Svg>
  );
}

export function LibraryIcon({ color, size = 24 }: IconProps) {
  // Three jars of ingredients on a shelf.
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke={color} strokeWidth={2} strokeLinecap="round" strokeLinejoin="round">
      <Rect x={3} y={8} width={5} height={11} rx={1} />
      <Rect x={9.5} y={5} width={5} height={14} rx={1} />
      <Rect x={16} y={10} width={5} height={9} rx={1} />
      <Path d="M2 21h20" />
    </Svg>
  );
}

export function RequirementsIcon({ color, size = 24 }: IconProps) {
  // A gauge with a floor and a ceiling mark.
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke={color} strokeWidth={2} strokeLinecap="round" strokeLinejoin="round">
      <Path d="M4 6h16M4 18h16" />
      <Path d="M9 15l3-6 3 6" />
    </Svg>
  );
}

export function InsectSupplyIcon({ color, size = 24 }: IconProps) {
  // A larva: a curved body of segments.
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke={color} strokeWidth={2} strokeLinecap="round" strokeLinejoin="round">
      <Path d="M5 15c0-5 4-9 9-9 3 0 5 2 5 4.5S17 15 14.5 15H9" />
      <Path d="M9 11.5v3.5M12.5 9v6M16 8.5v5" />
      <Circle cx={6.5} cy={17.5} r={2} />
    </Svg>
  );
}

export function AccountIcon({ color, size = 24 }: IconProps) {
  return (
    <Svg width={size} height={size} viewBox="0 0 24 24" fill="none" stroke={color} strokeWidth={2} strokeLinecap="round" strokeLinejoin="round">
      <Circle cx={12} cy={8} r={4} />
      <Path d="M4 21c1-4 4-6 8-6s7 2 8 6" />
    </Svg>
  );
}
