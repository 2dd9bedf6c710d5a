return SettingLint.Cli.CliApp.Run(args, Console.Out, Console.Error);
