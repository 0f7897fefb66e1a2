namespace Patchproof.Core.Reports;

/// <summary>The capture compared with the nominal and the fitted design on what survives chaos: overlays, horizons, exponents, dimension, return map, lobes, occupancy and spectra.</summary>
/// <remarks>
/// <para>Units: every voltage is a board state in volts (each channel's fitted offset removed and its signed gain
/// divided out, so a channel that records -y shows +y); every time is in seconds from the record's start, with
/// problem time units and Lyapunov times alongside where they help. Variables no channel recorded appear only in
/// the model traces.</para>
/// <para>Each part says whether it was computed (<c>Computed</c>) and, when not, why (<c>Reason</c>); a part that
/// cannot be computed never stops the others. Built by <see cref="FitComparisonBuilder"/>; the method behind each
/// part is in docs/dynamics.md.</para>
/// </remarks>
/// <param name="Computed">False when nothing could be compared (then only <paramref name="Reason"/> is meaningful).</param>
/// <param name="Reason">Why the comparison, or a part of it, is missing; empty when everything was computed.</param>
/// <param name="Settings">The settings and rules the comparison used.</param>
/// <param name="Invariants">One line per compared number: what the capture shows, what the fitted and the nominal design show.</param>
/// <param name="Overlays">Decimated time series and phase planes of the capture and of both designs restarted along it.</param>
/// <param name="Horizon">How long each design follows the capture.</param>
/// <param name="ModelLyapunov">The Lyapunov spectra of the fitted and nominal designs (Benettin).</param>
/// <param name="CaptureLyapunov">The largest Lyapunov exponent from the capture (Rosenstein).</param>
/// <param name="CorrelationDimension">The correlation dimension of the capture and of the fitted design's simulation (Grassberger-Procaccia).</param>
/// <param name="ReturnMap">The return map of successive maxima of one variable, capture against the fitted simulation.</param>
/// <param name="Lobes">Lobe switching of a two-lobed variable, capture against the fitted simulation.</param>
/// <param name="Occupancy">Phase-plane occupancy densities and their Hellinger distances.</param>
/// <param name="Spectra">Welch spectra of each recorded channel against both simulations.</param>
/// <param name="ElapsedSeconds">Wall time of the comparison.</param>
/// <param name="Timings">Wall time of each part, in the order computed.</param>
public sealed record FitComparison(
    bool Computed,
    string Reason,
    ComparisonSettings? Settings,
    IReadOnlyList<InvariantLine> Invariants,
    OverlayComparison? Overlays,
    HorizonComparison? Horizon,
    ModelLyapunovComparison? ModelLyapunov,
    CaptureLyapunovEstimate? CaptureLyapunov,
    DimensionComparison? CorrelationDimension,
    ReturnMapComparison? ReturnMap,
    LobeComparison? Lobes,
    OccupancyComparison? Occupancy,
    IReadOnlyList<ChannelSpectrum> Spectra,
    double ElapsedSeconds,
    IReadOnlyList<PartTiming> Timings)
{
    /// <summary>A comparison that could not be made at all.</summary>
    /// <param name="reason">Why, in plain words.</param>
    public static FitComparison NotComputed(string reason) => new(false, reason, null, [], null, null, null, null, null, null, null, null, [], 0, []);
}

/// <summary>How long one part of the comparison took.</summary>
/// <param name="Part">The part, for example "model Lyapunov spectra".</param>
/// <param name="Seconds">Its wall time.</param>
public sealed record PartTiming(string Part, double Seconds);

/// <summary>The settings a comparison used.</summary>
/// <param name="TimeScaleSeconds">The design's seconds per problem time unit.</param>
/// <param name="SampleIntervalSeconds">The capture's sample interval.</param>
/// <param name="SampleCount">Samples per channel.</param>
/// <param name="RecordedVariables">Variables a channel recorded.</param>
/// <param name="HiddenVariables">Variables no channel recorded, and how their state was rebuilt for the restarts.</param>
/// <param name="SimulationTolerance">Relative and absolute tolerance of the simulations.</param>
/// <param name="PointBudget">The most points any trace carries.</param>
/// <param name="Model">Which model the designs are simulated with.</param>
public sealed record ComparisonSettings(
    double TimeScaleSeconds,
    double SampleIntervalSeconds,
    int SampleCount,
    IReadOnlyList<string> RecordedVariables,
    IReadOnlyList<string> HiddenVariables,
    double SimulationTolerance,
    int PointBudget,
    string Model);

/// <summary>One compared number.</summary>
/// <param name="Name">What it is, for example "largest Lyapunov exponent".</param>
/// <param name="Unit">Its unit, for example "1/s".</param>
/// <param name="FromCapture">The capture's value (NaN when the number belongs to a model only).</param>
/// <param name="FromModel">The fitted design's value.</param>
/// <param name="FromNominal">The nominal design's value (NaN when not computed for it).</param>
public sealed record InvariantLine(string Name, string Unit, double FromCapture, double FromModel, double FromNominal);

/// <summary>One trace of a plot.</summary>
/// <param name="Role"><c>capture</c>, <c>nominal</c> or <c>fitted</c>.</param>
/// <param name="X">Abscissae.</param>
/// <param name="Y">Ordinates, as many.</param>
public sealed record PlotTrace(string Role, double[] X, double[] Y);

/// <summary>One plot: its labels and traces.</summary>
/// <param name="Title">For example "x against time".</param>
/// <param name="XLabel">The horizontal axis with its unit.</param>
/// <param name="YLabel">The vertical axis with its unit.</param>
/// <param name="Traces">The traces, capture first.</param>
public sealed record PlotPanel(string Title, string XLabel, string YLabel, IReadOnlyList<PlotTrace> Traces);

/// <summary>The overlays: capture, nominal and fitted design on one time axis and in every phase plane.</summary>
/// <param name="Computed">Whether the overlays were built.</param>
/// <param name="Reason">Why not, or empty.</param>
/// <param name="TimeSeries">One panel per design variable, time in seconds from the record's start.</param>
/// <param name="PhasePlanes">One panel per pair of design variables.</param>
/// <param name="RestartIntervalSeconds">Time between restarts from the capture's state.</param>
/// <param name="RestartIntervalLyapunovTimes">The same in Lyapunov times of the fitted design (NaN without an exponent).</param>
/// <param name="RestartTimesSeconds">Where the simulations were restarted.</param>
/// <param name="Decimation">Which decimation each kind of trace got.</param>
public sealed record OverlayComparison(
    bool Computed,
    string Reason,
    IReadOnlyList<PlotPanel> TimeSeries,
    IReadOnlyList<PlotPanel> PhasePlanes,
    double RestartIntervalSeconds,
    double RestartIntervalLyapunovTimes,
    double[] RestartTimesSeconds,
    string Decimation);

/// <summary>How long the two designs follow the capture.</summary>
/// <param name="BandStandardDeviations">The band: the RMS deviation, in channel standard deviations, that still counts as following.</param>
/// <param name="MaximumSeconds">The longest horizon looked for; restarts that stay within the band longer are censored there.</param>
/// <param name="ScoredVariables">The variables the deviation is taken over (the recorded ones).</param>
/// <param name="Fitted">The fitted design.</param>
/// <param name="Nominal">The nominal design.</param>
public sealed record HorizonComparison(double BandStandardDeviations, double MaximumSeconds, IReadOnlyList<string> ScoredVariables, HorizonEstimate Fitted, HorizonEstimate Nominal);

/// <summary>One design's predictability horizon.</summary>
/// <param name="Role"><c>fitted</c> or <c>nominal</c>.</param>
/// <param name="Computed">Whether it was measured.</param>
/// <param name="Reason">Why not, or empty.</param>
/// <param name="MeanSeconds">The mean horizon over restarts.</param>
/// <param name="MedianSeconds">The median horizon.</param>
/// <param name="MeanProblemUnits">The mean in problem time units.</param>
/// <param name="MeanLyapunovTimes">The mean in Lyapunov times of the fitted design (NaN without an exponent).</param>
/// <param name="CensoredRestarts">Restarts that never left the band.</param>
/// <param name="RestartTimesSeconds">Each restart's time.</param>
/// <param name="HorizonsSeconds">Each restart's horizon.</param>
public sealed record HorizonEstimate(
    string Role,
    bool Computed,
    string Reason,
    double MeanSeconds,
    double MedianSeconds,
    double MeanProblemUnits,
    double MeanLyapunovTimes,
    int CensoredRestarts,
    double[] RestartTimesSeconds,
    double[] HorizonsSeconds);

/// <summary>The model spectra of both designs.</summary>
/// <param name="Method">How they were computed.</param>
/// <param name="Fitted">The fitted design.</param>
/// <param name="Nominal">The nominal design.</param>
public sealed record ModelLyapunovComparison(string Method, ModelLyapunovEstimate Fitted, ModelLyapunovEstimate Nominal);

/// <summary>One design's Lyapunov spectrum from its variational equations.</summary>
/// <param name="Role"><c>fitted</c> or <c>nominal</c>.</param>
/// <param name="Computed">Whether it was computed.</param>
/// <param name="Reason">Why not (or why it stopped early), or empty.</param>
/// <param name="ExponentsPerSecond">The spectrum, largest first, in 1/s.</param>
/// <param name="ExponentsPerProblemUnit">The same per problem time unit (times the time scale).</param>
/// <param name="LargestPerSecond">lambda_1 in 1/s.</param>
/// <param name="LargestPerProblemUnit">lambda_1 per problem time unit.</param>
/// <param name="LyapunovTimeSeconds">1 / lambda_1 (NaN unless lambda_1 &gt; 0).</param>
/// <param name="KaplanYorkeDimension">D_KY.</param>
/// <param name="DurationSeconds">The time averaged over.</param>
/// <param name="DurationProblemUnits">The same in problem time units.</param>
public sealed record ModelLyapunovEstimate(
    string Role,
    bool Computed,
    string Reason,
    double[] ExponentsPerSecond,
    double[] ExponentsPerProblemUnit,
    double LargestPerSecond,
    double LargestPerProblemUnit,
    double LyapunovTimeSeconds,
    double KaplanYorkeDimension,
    double DurationSeconds,
    double DurationProblemUnits);

/// <summary>A straight line fitted over a stretch of a curve.</summary>
/// <param name="FirstIndex">First index of the stretch in the curve's arrays.</param>
/// <param name="LastIndex">Last index, included.</param>
/// <param name="FromX">The abscissa at the first index.</param>
/// <param name="ToX">The abscissa at the last index.</param>
/// <param name="Slope">The least-squares slope.</param>
/// <param name="Intercept">The least-squares intercept.</param>
public sealed record FittedLine(int FirstIndex, int LastIndex, double FromX, double ToX, double Slope, double Intercept);

/// <summary>The largest Lyapunov exponent from the capture by Rosenstein's method on a delay embedding of one channel.</summary>
/// <param name="Computed">Whether it was estimated.</param>
/// <param name="Reason">Why not, or empty.</param>
/// <param name="Channel">The channel embedded.</param>
/// <param name="Variable">The variable it records.</param>
/// <param name="LargestPerSecond">lambda_1 in 1/s.</param>
/// <param name="LargestPerProblemUnit">lambda_1 per problem time unit.</param>
/// <param name="DelaySamples">The embedding delay.</param>
/// <param name="DelaySeconds">The same in seconds.</param>
/// <param name="EmbeddingDimension">The embedding dimension.</param>
/// <param name="DelayRule">Which rule chose the delay.</param>
/// <param name="MutualInformationBits">The mutual information against the lag in samples (0, 1, ...), whose first minimum is the delay.</param>
/// <param name="FalseNeighbourFractions">The false-nearest-neighbour fraction for dimensions 1, 2, ...; the dimension is the first below 1 %.</param>
/// <param name="TemporalExclusionSamples">Neighbours closer in time than this were not used.</param>
/// <param name="ReferencePoints">Reference points averaged over.</param>
/// <param name="TimesSeconds">Times of the divergence curve.</param>
/// <param name="MeanLogDivergence">The mean log distance of neighbour pairs at each time, ln(volts).</param>
/// <param name="Fit">The fitted slope region (indices into the curve, times in seconds); null unless estimated.</param>
public sealed record CaptureLyapunovEstimate(
    bool Computed,
    string Reason,
    string Channel,
    string Variable,
    double LargestPerSecond,
    double LargestPerProblemUnit,
    int DelaySamples,
    double DelaySeconds,
    int EmbeddingDimension,
    string DelayRule,
    double[] MutualInformationBits,
    double[] FalseNeighbourFractions,
    int TemporalExclusionSamples,
    int ReferencePoints,
    double[] TimesSeconds,
    double[] MeanLogDivergence,
    FittedLine? Fit);

/// <summary>Correlation dimensions of the capture and of the fitted simulation, over the same recorded variables.</summary>
/// <param name="Variables">The variables forming the state.</param>
/// <param name="Capture">From the capture.</param>
/// <param name="Fitted">From the fitted design's simulation of the same length.</param>
public sealed record DimensionComparison(IReadOnlyList<string> Variables, CorrelationDimensionEstimate Capture, CorrelationDimensionEstimate Fitted);

/// <summary>One correlation dimension with the curve and scaling region behind it.</summary>
/// <param name="Role"><c>capture</c> or <c>fitted</c>.</param>
/// <param name="Computed">Whether it was estimated.</param>
/// <param name="Reason">Why not, or empty.</param>
/// <param name="Dimension">D_2.</param>
/// <param name="LogRadius">ln r, r in volts.</param>
/// <param name="LogCorrelationSum">ln C(r).</param>
/// <param name="LocalSlopes">d ln C / d ln r.</param>
/// <param name="Fit">The scaling region (abscissae ln r); null unless estimated.</param>
/// <param name="TheilerWindowSamples">Pairs closer in time were not counted.</param>
/// <param name="ReferencePoints">Reference points used.</param>
public sealed record CorrelationDimensionEstimate(
    string Role,
    bool Computed,
    string Reason,
    double Dimension,
    double[] LogRadius,
    double[] LogCorrelationSum,
    double[] LocalSlopes,
    FittedLine? Fit,
    int TheilerWindowSamples,
    int ReferencePoints);

/// <summary>The return map of successive maxima of one variable, capture against the fitted simulation.</summary>
/// <param name="Computed">Whether it was built.</param>
/// <param name="Reason">Why not, or empty.</param>
/// <param name="Variable">The variable whose maxima are mapped.</param>
/// <param name="ChoiceRule">How the variable was chosen.</param>
/// <param name="Capture">The capture's map.</param>
/// <param name="Fitted">The fitted simulation's map.</param>
public sealed record ReturnMapComparison(bool Computed, string Reason, string Variable, string ChoiceRule, ReturnMapSeries? Capture, ReturnMapSeries? Fitted);

/// <summary>One return map: pairs (M_n, M_n+1) in volts and the fitted shape.</summary>
/// <param name="Role"><c>capture</c> or <c>fitted</c>.</param>
/// <param name="Current">M_n of each pair.</param>
/// <param name="Next">M_n+1 of each pair.</param>
/// <param name="HasShape">True when the map held enough maxima for a shape.</param>
/// <param name="ApexInputVolts">M_n at the apex.</param>
/// <param name="ApexOutputVolts">M_n+1 at the apex.</param>
/// <param name="LeftSlope">Slope of the rising branch.</param>
/// <param name="RightSlope">Slope of the falling branch.</param>
/// <param name="FixedPointVolts">Where the falling branch crosses M_n+1 = M_n.</param>
/// <param name="ScatterRmsVolts">RMS distance of the pairs from the branch lines.</param>
/// <param name="ExpandingSingleHump">True when every local slope is steeper than 1 in magnitude (the map stretches everywhere).</param>
public sealed record ReturnMapSeries(
    string Role,
    double[] Current,
    double[] Next,
    bool HasShape,
    double ApexInputVolts,
    double ApexOutputVolts,
    double LeftSlope,
    double RightSlope,
    double FixedPointVolts,
    double ScatterRmsVolts,
    bool ExpandingSingleHump);

/// <summary>Lobe switching of one variable about a centre, capture against the fitted simulation.</summary>
/// <param name="Computed">Whether a two-lobed variable was found.</param>
/// <param name="Reason">Why not, or empty.</param>
/// <param name="Variable">The variable whose sign names the lobe.</param>
/// <param name="CentreVolts">The value separating the lobes.</param>
/// <param name="Capture">The capture's statistics.</param>
/// <param name="Fitted">The fitted simulation's statistics.</param>
public sealed record LobeComparison(bool Computed, string Reason, string Variable, double CentreVolts, LobeEstimate? Capture, LobeEstimate? Fitted);

/// <summary>One record's lobe statistics.</summary>
/// <param name="Role"><c>capture</c> or <c>fitted</c>.</param>
/// <param name="Switches">Passages from one lobe to the other.</param>
/// <param name="SwitchesPerSecond">The switching rate.</param>
/// <param name="MeanResidenceSeconds">The mean complete visit.</param>
/// <param name="PositiveFraction">The fraction of time in the positive lobe.</param>
/// <param name="TwoLobed">Whether both lobes hold 10 % of the time with 3 switches or more.</param>
/// <param name="ResidenceSeconds">Every complete visit, positive lobe first.</param>
public sealed record LobeEstimate(string Role, int Switches, double SwitchesPerSecond, double MeanResidenceSeconds, double PositiveFraction, bool TwoLobed, double[] ResidenceSeconds);

/// <summary>Phase-plane occupancy of the capture against the fitted and the nominal simulation.</summary>
/// <param name="Computed">Whether it was computed (needs two recorded variables).</param>
/// <param name="Reason">Why not, or empty.</param>
/// <param name="Distance">The distance used: "Hellinger".</param>
/// <param name="WhyThisDistance">Why it suits a chaotic comparison.</param>
/// <param name="Bins">Cells per axis.</param>
/// <param name="SmoothingCells">The Gaussian smoothing in cells.</param>
/// <param name="Planes">One entry per pair of recorded variables.</param>
public sealed record OccupancyComparison(bool Computed, string Reason, string Distance, string WhyThisDistance, int Bins, double SmoothingCells, IReadOnlyList<OccupancyPlane> Planes);

/// <summary>One phase plane's occupancy: the grid, both densities and their difference.</summary>
/// <param name="XVariable">The horizontal variable.</param>
/// <param name="YVariable">The vertical variable.</param>
/// <param name="FittedDistance">Hellinger distance, capture against the fitted simulation.</param>
/// <param name="NominalDistance">Hellinger distance, capture against the nominal simulation.</param>
/// <param name="XCentres">Cell centres along x, volts.</param>
/// <param name="YCentres">Cell centres along y, volts.</param>
/// <param name="Capture">The capture's probabilities, rows by y.</param>
/// <param name="Fitted">The fitted simulation's probabilities on the same grid, rows by y.</param>
/// <param name="Difference">Capture minus fitted, rows by y.</param>
public sealed record OccupancyPlane(
    string XVariable,
    string YVariable,
    double FittedDistance,
    double NominalDistance,
    double[] XCentres,
    double[] YCentres,
    double[][] Capture,
    double[][] Fitted,
    double[][] Difference);

/// <summary>Welch spectra of one recorded channel and of the same variable in both simulations.</summary>
/// <param name="Channel">The channel.</param>
/// <param name="Variable">The variable it records.</param>
/// <param name="Computed">Whether the spectra were estimated.</param>
/// <param name="Reason">Why not, or empty.</param>
/// <param name="FrequenciesHertz">Bin frequencies.</param>
/// <param name="Capture">The capture's one-sided density, V²/Hz.</param>
/// <param name="Fitted">The fitted simulation's density.</param>
/// <param name="Nominal">The nominal simulation's density.</param>
/// <param name="CapturePeakHertz">The capture's peak frequency (DC excluded).</param>
/// <param name="FittedPeakHertz">The fitted simulation's peak frequency.</param>
/// <param name="NominalPeakHertz">The nominal simulation's peak frequency.</param>
/// <param name="CaptureMeanHertz">The capture's power-weighted mean frequency.</param>
/// <param name="FittedMeanHertz">The fitted simulation's mean frequency.</param>
/// <param name="NominalMeanHertz">The nominal simulation's mean frequency.</param>
/// <param name="SegmentLength">Samples per Welch segment.</param>
/// <param name="Segments">Segments averaged for the capture.</param>
public sealed record ChannelSpectrum(
    string Channel,
    string Variable,
    bool Computed,
    string Reason,
    double[] FrequenciesHertz,
    double[] Capture,
    double[] Fitted,
    double[] Nominal,
    double CapturePeakHertz,
    double FittedPeakHertz,
    double NominalPeakHertz,
    double CaptureMeanHertz,
    double FittedMeanHertz,
    double NominalMeanHertz,
    int SegmentLength,
    int Segments);
