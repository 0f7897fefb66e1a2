using Bunit;
using Microsoft.AspNetCore.Components.Forms;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Benches;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Pages.Benches;

public sealed class ProbeCalibrationPanelTests : BunitContext
{
    private readonly FakePatchproofApi api = new();

    public ProbeCalibrationPanelTests()
    {
        JSInterop.Mode = JSRuntimeMode.Loose;
        Services.AddSingleton<IPatchproofApi>(api);
    }

    private IRenderedComponent<ProbeCalibrationPanel> RenderPanel() => Render<ProbeCalibrationPanel>(ps => ps.Add(p => p.BenchId, DemoData.BenchId));

    [Fact]
    public void Render_WhileLoading_ShowsPendingAndStillOffersTheUpload()
    {
        api.Calibrations = FakePatchproofApi.Never<IReadOnlyList<ProbeCalibrationView>>();

        var cut = RenderPanel();

        Assert.Equal(ProbeCalibrationPanelState.Loading, cut.Instance.State);
        Assert.Contains("Loading the probe calibration", cut.Find("[role=status]").TextContent, StringComparison.Ordinal);
        Assert.NotNull(cut.Find("#calibration-file"));
    }

    [Fact]
    public void Render_NoCalibration_SaysFitsUseTheProbeToleranceAndShowsTheHowToWithTheCaution()
    {
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([]);

        var cut = RenderPanel();

        cut.WaitForAssertion(() =>
        {
            Assert.Equal(ProbeCalibrationPanelState.Empty, cut.Instance.State);
            Assert.Contains("no probe calibration yet", cut.Find(".empty").TextContent, StringComparison.Ordinal);
            Assert.Empty(cut.FindAll("table.gains"));
            var howTo = cut.Find(".how-to").TextContent;
            Assert.Contains("calibration output", howTo, StringComparison.Ordinal);
            Assert.Contains("several hundred periods", howTo, StringComparison.Ordinal);
            Assert.Contains("any stable trigger", howTo, StringComparison.Ordinal);
            Assert.Contains("licence your local rules require", cut.Find(".bench-safety").TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_ServerRefuses_ShowsTheProblemInWords()
    {
        api.Calibrations = FakePatchproofApi.Problem<IReadOnlyList<ProbeCalibrationView>>(500, "The server failed", "The data folder cannot be read.");

        var cut = RenderPanel();

        cut.WaitForAssertion(() =>
        {
            Assert.Equal(ProbeCalibrationPanelState.Failed, cut.Instance.State);
            var alert = cut.Find("[role=alert]").TextContent;
            Assert.Contains("The probe calibration could not be loaded.", alert, StringComparison.Ordinal);
            Assert.Contains("The data folder cannot be read.", alert, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_WithCalibrations_ShowsTheNewestGainsUncertaintyAndCheck()
    {
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([Calibration(1.0183, followsReference: true), Calibration(1.05, followsReference: true)]);

        var cut = RenderPanel();

        cut.WaitForAssertion(() =>
        {
            Assert.Equal(ProbeCalibrationPanelState.Loaded, cut.Instance.State);
            Assert.Contains("Check passed", cut.Find(".current .check").TextContent, StringComparison.Ordinal);
            var rows = cut.FindAll("table.gains tbody tr");
            Assert.Equal(2, rows.Count);
            Assert.Contains("1 (reference)", rows[0].TextContent, StringComparison.Ordinal);
            Assert.Contains("1.01830", rows[1].TextContent, StringComparison.Ordinal);
            Assert.Contains("+1.83 %", rows[1].TextContent, StringComparison.Ordinal);
            // GainSd 4.1e-5 of 1.0183 is 0.004 %.
            Assert.Contains("0.004 %", rows[1].TextContent, StringComparison.Ordinal);
            Assert.Contains("2026-11-30 14:05 UTC", cut.Find(".meta").TextContent, StringComparison.Ordinal);
            Assert.Contains("1 earlier calibration is kept", cut.Markup, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_ChannelFailedTheOneSignalCheck_SaysWhichOne()
    {
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([Calibration(0.91, followsReference: false)]);

        var cut = RenderPanel();

        cut.WaitForAssertion(() => Assert.Contains("Check failed: CH2 did not follow CH1", cut.Find(".current .check").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void Calibrate_CaptureAccepted_SendsTheFileAndNoteAndShowsTheNewCalibrationFirst()
    {
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([]);
        var sent = new List<(string File, string Content, string? Note)>();
        api.Calibrate = (file, details) =>
        {
            using var reader = new StreamReader(file.OpenRead());
            sent.Add((file.FileName, reader.ReadToEnd(), details.Note));
            return FakePatchproofApi.Ok(Calibration(1.0183, followsReference: true) with { SourceFiles = [file.FileName] });
        };
        var cut = RenderPanel();
        cut.WaitForAssertion(() => Assert.Equal(ProbeCalibrationPanelState.Empty, cut.Instance.State));

        Assert.True(cut.Find(".calibration-upload button[type=submit]").HasAttribute("disabled"));
        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText("t,CH1,CH2\n0,1,1.02\n", "wren-cal.csv", contentType: "text/csv"));
        cut.Find("#calibration-note").Change("x integrator output");
        cut.Find("form.calibration-upload").Submit();

        cut.WaitForAssertion(() =>
        {
            Assert.Equal([("wren-cal.csv", "t,CH1,CH2\n0,1,1.02\n", "x integrator output")], sent);
            Assert.Equal(ProbeCalibrationPanelState.Loaded, cut.Instance.State);
            Assert.Contains("wren-cal.csv stored", cut.Find(".stored").TextContent, StringComparison.Ordinal);
            Assert.Contains("1.01830", cut.Find("table.gains").TextContent, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Calibrate_SquareWaveOfKnownAmplitude_SendsTheAmplitudeAndItsAccuracyAndShowsTheAbsoluteGain()
    {
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([]);
        CalibrationCaptureDetails? sent = null;
        api.Calibrate = (file, details) =>
        {
            sent = details;
            return FakePatchproofApi.Ok(Calibration(0.9873, followsReference: true) with
            {
                SourceFiles = [file.FileName],
                KnownAmplitude = new KnownAmplitudeView(10, 0.001, 1.0102, 0.0027),
            });
        };
        var cut = RenderPanel();
        cut.WaitForAssertion(() => Assert.Equal(ProbeCalibrationPanelState.Empty, cut.Instance.State));

        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText("t,CH1,CH2\n0,6,6\n", "square.csv", contentType: "text/csv"));
        cut.Find("#calibration-amplitude").Change("10V");
        cut.Find("#calibration-accuracy").Change("0.1%");
        cut.Find("form.calibration-upload").Submit();

        cut.WaitForAssertion(() =>
        {
            Assert.Equal(new CalibrationCaptureDetails(null, "10V", "0.1%"), sent);
            var meta = cut.Find(".current .meta .absolute").TextContent;
            Assert.Contains("10 V peak to peak", meta, StringComparison.Ordinal);
            Assert.Contains("1.0102 ± 0.0027", meta, StringComparison.Ordinal);
        });
    }

    [Fact]
    public void Render_RelativeCalibration_SaysTheReferenceGainIsNotMeasured()
    {
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([Calibration(1.0183, followsReference: true)]);

        var cut = RenderPanel();

        cut.WaitForAssertion(() => Assert.Contains("own gain is not measured", cut.Find(".current .meta .relative").TextContent, StringComparison.Ordinal));
        Assert.Empty(cut.FindAll(".current .meta .absolute"));
    }

    [Fact]
    public void Calibrate_CaptureRefused_ShowsTheLocatedErrorsAndKeepsTheEarlierState()
    {
        api.Calibrations = FakePatchproofApi.Ok<IReadOnlyList<ProbeCalibrationView>>([]);
        api.Calibrate = (_, _) => Task.FromResult(ApiResult<ProbeCalibrationView>.Fail(new ApiProblem(422, "The calibration capture cannot be read", "Line 3, column 2: 'x' is not a number",
            ["wren-cal.csv, line 3, column 2: 'x' is not a number"])));
        var cut = RenderPanel();
        cut.WaitForAssertion(() => Assert.Equal(ProbeCalibrationPanelState.Empty, cut.Instance.State));

        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText("t,CH1,CH2\n0,1,1\n0.1,x,1\n", "wren-cal.csv"));
        cut.Find("form.calibration-upload").Submit();

        cut.WaitForAssertion(() =>
        {
            var alert = cut.Find("[role=alert]").TextContent;
            Assert.Contains("No calibration was stored.", alert, StringComparison.Ordinal);
            Assert.Contains("wren-cal.csv, line 3, column 2", alert, StringComparison.Ordinal);
            Assert.Equal(ProbeCalibrationPanelState.Empty, cut.Instance.State);
            Assert.Empty(cut.FindAll(".stored"));
        });
    }

    private static ProbeCalibrationView Calibration(double gain, bool followsReference) => DemoData.ProbeCalibration(gain, followsReference);
}
