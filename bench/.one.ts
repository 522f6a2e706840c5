import { benchStartup } from "./startup.js";
benchStartup(9);
