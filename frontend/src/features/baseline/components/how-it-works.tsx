import Box from '@mui/material/Box';

/** The method in a few plain sentences; the technical terms come after the words that explain them. */
export function HowItWorks() {
  return (
    <Box
      component="ul"
      sx={{ m: 0, pl: 2.5, '& li': { mb: 0.75 }, typography: 'body2' }}
      aria-label="How the numbers are worked out"
    >
      <li>
        Your weight with riding gear is split between the wheels. The fork carries the front share, standing;
        the shock carries the rear share, seated, multiplied by the leverage ratio (how far the wheel moves
        for each millimetre of shock movement).
      </li>
      <li>
        The pressure is the one at which the air spring holds that load at the target sag, for a slow push
        like measuring sag: the air is squeezed slowly enough to stay at the same temperature (in the physics,
        a polytropic index of 1.0).
      </li>
      <li>
        A hard landing is taken as a few times the load at sag. It squeezes the air fast, so the air heats up
        and pushes back harder (a polytropic index up to 1.4, the value for air). The travel-used table and
        the curves other than the baseline are for such a landing.
      </li>
      <li>
        Pressures are gauge pressures: above the air around you. That air is thinner higher up (standard
        atmosphere, 101 325 Pa at sea level), so the same air in the spring reads a little higher on a gauge
        up a mountain.
      </li>
      <li>
        Numbers are rounded the way a pump gauge and a tape measure read them. Every default below says where
        it comes from.
      </li>
    </Box>
  );
}
