using Bunit;
using Microsoft.AspNetCore.Components.Forms;
using Microsoft.Extensions.DependencyInjection;
using Patchproof.Client.Components.Pages.Captures;
using Patchproof.Client.Models;
using Patchproof.Client.Services;
using Patchproof.Client.Tests.Fakes;

namespace Patchproof.Client.Tests.Components.Pages.Captures;

public sealed class CaptureUploadPageTests : BunitContext
{
    private readonly FakePatchproofApi api = new();

    public CaptureUploadPageTests()
    {
        JSInterop.Mode = JSRuntimeMode.Loose;
        Services.AddSingleton<IPatchproofApi>(api);
        api.Design = _ => FakePatchproofApi.Ok(DemoData.LorenzDesign);
        api.DesignVersions = FakePatchproofApi.Ok<IReadOnlyList<DesignVersionEntry>>([new(1, null, DemoData.At)]);
    }

    private IRenderedComponent<CaptureUploadPage> RenderPage() => Render<CaptureUploadPage>(ps => ps.Add(p => p.BoardId, DemoData.BoardId));

    [Fact]
    public void Render_BeforeAnyFile_ShowsTheDropZoneAndTheBenchSafetyCaution()
    {
        var cut = RenderPage();

        Assert.Contains("Drop capture files here", cut.Find(".drop-zone").TextContent, StringComparison.Ordinal);
        Assert.Contains("Your lab's own rules", cut.Find(".bench-safety").TextContent, StringComparison.Ordinal);
        Assert.Empty(cut.FindAll(".upload"));
    }

    [Fact]
    public void Upload_TwoFiles_SendsBothAndShowsTheirChecks()
    {
        var sent = new List<string>();
        api.Upload = (file, progress) =>
        {
            sent.Add(file.FileName);
            using var stream = file.OpenRead();
            progress?.Report(new UploadProgress(file.FileName, file.SizeBytes, file.SizeBytes));
            return FakePatchproofApi.Ok(DemoData.Capture(new CaptureCheckEntry(CheckSeverity.Warning, 0, 0, "Channel CH3 touches the top of the scope's window: z may be clipped.")) with { FileName = file.FileName });
        };
        var cut = RenderPage();

        cut.FindComponent<InputFile>().UploadFiles(
            InputFileContent.CreateFromText("t,CH1\n0,1\n", "plover-a.csv", contentType: "text/csv"),
            InputFileContent.CreateFromText("t,CH1\n0,2\n", "plover-b.csv", contentType: "text/csv"));

        cut.WaitForAssertion(() =>
        {
            Assert.Equal(["plover-a.csv", "plover-b.csv"], sent);
            Assert.Equal(2, cut.FindAll(".upload").Count);
            Assert.All(cut.FindAll(".upload-state"), s => Assert.Equal("stored and checked", s.TextContent));
            Assert.Contains("Take care: Channel CH3 touches the top", cut.Find(".capture-checks").TextContent, StringComparison.Ordinal);
            Assert.Equal("1", cut.Find("progress").GetAttribute("value"));
        });
    }

    [Fact]
    public void Upload_Refused_ShowsTheLocatedProblem()
    {
        api.Upload = (_, _) => Task.FromResult(ApiResult<CaptureEntry>.Fail(new ApiProblem(422, "The capture could not be read", null, ["line 3, column 2: 'x' is not a number."])));
        var cut = RenderPage();

        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText("t,CH1\n0,x\n", "broken.csv"));

        cut.WaitForAssertion(() =>
        {
            Assert.Contains("line 3, column 2", cut.Find(".problem-notice").TextContent, StringComparison.Ordinal);
            Assert.Equal("refused", cut.Find(".upload-state").TextContent);
        });
    }

    [Fact]
    public void MappingCheck_SuggestsAnother_OffersToTakeIt()
    {
        api.Upload = (_, _) => FakePatchproofApi.Ok(DemoData.Capture());
        api.MappingCheck = _ => FakePatchproofApi.Ok(new MappingCheck(false, [new("CH1", "x", 1), new("CH2", "y", -1), new("CH3", "z", 1)],
            "Another assignment fits the equations far better."));
        var cut = RenderPage();
        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText("t\n", "plover.csv"));
        cut.WaitForAssertion(() => cut.Find(".mapping button"));

        cut.Find(".mapping button").Click();
        cut.WaitForAssertion(() => Assert.Contains("CH2 = -y", cut.Find(".suggests").TextContent, StringComparison.Ordinal));
        cut.Find(".suggests button").Click();

        Assert.Equal("-1", cut.Find("select[aria-label='Sign of CH2']").GetAttribute("value"));
    }

    [Fact]
    public void MappingCheck_ServerCannotCheck_SaysSo()
    {
        api.Upload = (_, _) => FakePatchproofApi.Ok(DemoData.Capture());
        api.MappingCheck = _ => FakePatchproofApi.Problem<MappingCheck>(404, "Not found on the server");
        var cut = RenderPage();
        cut.FindComponent<InputFile>().UploadFiles(InputFileContent.CreateFromText("t\n", "plover.csv"));
        cut.WaitForAssertion(() => cut.Find(".mapping button"));

        cut.Find(".mapping button").Click();

        cut.WaitForAssertion(() => Assert.Contains("This server cannot check mappings yet.", cut.Find(".mapping .problem-notice").TextContent, StringComparison.Ordinal));
    }

    [Fact]
    public void DesignVariables_ReadsTheLeftHandSides()
    {
        Assert.Equal(["x", "y", "z"], DesignVariables.Of(DemoData.LorenzDesign));
    }
}
