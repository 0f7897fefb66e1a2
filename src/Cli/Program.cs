using Patchproof.Cli;

return PatchproofCommandLine.Run(args, Console.Out, Console.Error);
